import { QueryTypes } from "sequelize";
import { describe, expect, it } from "vitest";
import { createApp } from "../../server/app";
import { sequelize } from "../../server/db/sequelize";
import { addDays, localDate } from "../../server/lib/clock";
import { loadDigestersToday } from "../../server/modules/digesters/digester-state.service";
import { roomOnDateKg } from "../../server/modules/rounds/rounds.service";
import { createHousehold, signedInClient, sql } from "../helpers/db";
import { roundsScene } from "../helpers/rounds-fixtures";

const app = createApp({ requestLogging: false });
const scene = (forDate?: string) => roundsScene(app, forDate);
const today = () => localDate(new Date());

type Round = {
  id: number;
  volunteerId: number;
  endDigesterId: number;
  stopCount: number;
  loadKg: number;
  status: string;
  collectedCount: number;
};
type Unplaced = { requestId: number; householdName: string; reason: string; message: string };

/** The stops of these rounds, by round and seq (from the database). */
async function stopsOf(roundIds: number[]) {
  return sql<{ round_id: number; request_id: number }>(
    `SELECT round_id, request_id FROM collection_round_stops WHERE round_id = ANY($1::int[]) ORDER BY round_id, seq`,
    [roundIds],
  );
}

/** Everything a collection may have written for a household or a round: drop-offs, request statuses, stop links. */
async function collectionTrace(householdIds: number[], roundId: number) {
  const [row] = await sql<{ drop_offs: number; collected: number; linked: number }>(
    `SELECT (SELECT count(*)::int FROM drop_offs WHERE household_id = ANY($1::int[])) AS drop_offs,
            (SELECT count(*)::int FROM collection_requests WHERE household_id = ANY($1::int[]) AND status = 'collected') AS collected,
            (SELECT count(*)::int FROM collection_round_stops WHERE round_id = $2 AND drop_off_id IS NOT NULL) AS linked`,
    [householdIds, roundId],
  );
  return row;
}

describe("collection requests", () => {
  it("a resident asks for a collection for their own household, once per day, and can cancel it", async () => {
    const { forDate, residents } = await scene();
    const r = residents[0]!;
    const res = await r.client.post("/api/collection-requests").send({ forDate, bucketCount: 2 });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ householdId: r.household.id, forDate, bucketCount: 2, status: "open" });
    const twice = await r.client.post("/api/collection-requests").send({ forDate, bucketCount: 1 });
    expect(twice.status).toBe(409);
    const past = await r.client.post("/api/collection-requests").send({ forDate: "2020-01-01", bucketCount: 1 });
    expect(past.status).toBe(400);
    expect(past.body.error.fields.forDate).toBeTruthy();
    const bad = await r.client.post("/api/collection-requests").send({ forDate, bucketCount: 0, householdId: 1 });
    expect(bad.status).toBe(400);
    const mine = await r.client.get("/api/collection-requests?mine=true");
    expect(mine.body.requests.map((x: { id: number }) => x.id)).toContain(res.body.id);
    const all = await r.client.get("/api/collection-requests?mine=false");
    expect(all.status).toBe(403);
    const cancelled = await r.client.post(`/api/collection-requests/${res.body.id}/cancel`).send({});
    expect(cancelled.body.status).toBe("cancelled");
    const other = await residents[1]!.client.post(`/api/collection-requests/${res.body.id}/cancel`).send({});
    expect(other.status).toBe(403);
  });
});

describe("collection rounds", () => {
  it("plans a round, gives the sheet and valid GeoJSON, and a collected stop becomes a pending drop-off", async () => {
    // Today: a stop is collected on its round's day.
    const { forDate, digester, residents, volunteer, coordinator, spot } = await scene(today());
    for (const r of residents)
      expect((await r.client.post("/api/collection-requests").send({ forDate, bucketCount: 2 })).status).toBe(201);

    const plan = await coordinator.post("/api/collection-rounds/plan").send({ forDate });
    expect(plan.status).toBe(200);
    const round = plan.body.rounds.find((x: { volunteerId: number }) => x.volunteerId === volunteer.person.id);
    expect(round).toMatchObject({ endDigesterId: digester.id, stopCount: 3, loadKg: 30, status: "planned" });

    const sheet = await volunteer.get(`/api/collection-rounds/${round.id}`);
    expect(sheet.status).toBe(200);
    // Start at the spot, households 111 m apart going north, digester at 0.005°: the short order is 1, 2, 3.
    expect(sheet.body.stops.map((s: { addressText: string }) => s.addressText)).toEqual([
      "1 Sorrel Lane",
      "2 Sorrel Lane",
      "3 Sorrel Lane",
    ]);
    expect(sheet.body.stops.map((s: { bucketCount: number }) => s.bucketCount)).toEqual([2, 2, 2]);
    const stranger = await signedInClient(app, { roles: ["resident"] });
    expect((await stranger.get(`/api/collection-rounds/${round.id}`)).status).toBe(403);
    const own = await volunteer.get(`/api/collection-rounds?date=${forDate}`);
    expect(own.body.rounds.map((x: { id: number }) => x.id)).toEqual([round.id]);

    const geo = await volunteer.get(`/api/collection-rounds/${round.id}/geojson`);
    expect(geo.status).toBe(200);
    expect(geo.headers["content-type"]).toMatch(/^application\/geo\+json/);
    const fc = JSON.parse(geo.text);
    // RFC 7946 §3.3 FeatureCollection of Features (§3.2) with geometry and properties; positions are [longitude, latitude] (§3.1.1).
    expect(fc.type).toBe("FeatureCollection");
    expect(fc.crs).toBeUndefined();
    for (const f of fc.features) {
      expect(f.type).toBe("Feature");
      expect(f).toHaveProperty("properties");
      expect(["LineString", "Point"]).toContain(f.geometry.type);
    }
    const line = fc.features.find((f: { geometry: { type: string } }) => f.geometry.type === "LineString");
    // RFC 7946 §3.1.4: a LineString has two or more positions.
    expect(line.geometry.coordinates.length).toBe(5);
    expect(line.geometry.coordinates[0][0]).toBeCloseTo(spot.lng, 9);
    expect(line.geometry.coordinates[0][1]).toBeCloseTo(spot.lat, 9);
    const points = fc.features.filter((f: { properties: { kind: string } }) => f.properties.kind === "stop");
    expect(points).toHaveLength(3);
    for (const p of points) {
      const [lng, lat] = p.geometry.coordinates;
      expect(Math.abs(lng)).toBeLessThanOrEqual(180);
      expect(Math.abs(lat)).toBeLessThanOrEqual(90);
    }

    // The steward's bucket density (1 kg/L) is for weighing on acceptance; the ledger records what the plan reserved.
    await sql(`UPDATE digesters SET bucket_kg_per_litre = 1.0 WHERE id = $1`, [digester.id]);
    const first = sheet.body.stops[0];
    const collected = await volunteer
      .post(`/api/collection-rounds/${round.id}/stops/${first.requestId}/collected`)
      .send({});
    expect(collected.status).toBe(200);
    const stop = collected.body.stops[0];
    expect(stop).toMatchObject({ status: "collected" });
    const [dropOff] = await sql<{
      digester_id: number;
      household_id: number;
      status: string;
      bucket_count: number;
      fresh_kg: number;
      for_date: string;
    }>(
      `SELECT digester_id, household_id, status, bucket_count, fresh_kg::float8 AS fresh_kg, for_date::text AS for_date FROM drop_offs WHERE id = $1`,
      [stop.dropOffId],
    );
    // 2 buckets × 5 kg (COLLECTION_BUCKET_KG), as planned, not 2 × 10 L × 1 kg/L.
    expect(dropOff).toEqual({
      digester_id: digester.id,
      household_id: first.householdId,
      status: "pending",
      bucket_count: 2,
      fresh_kg: 10,
      for_date: forDate,
    });
    const again = await volunteer
      .post(`/api/collection-rounds/${round.id}/stops/${first.requestId}/collected`)
      .send({});
    expect(again.status).toBe(409);
    const [{ count }] = (await sql<{ count: string }>(`SELECT count(*) FROM drop_offs WHERE household_id = $1`, [
      first.householdId,
    ])) as [{ count: string }];
    expect(Number(count)).toBe(1);
  });

  it("a cancelled stop leaves its round lighter and shorter; a round left with nothing to collect is cancelled", async () => {
    const { forDate, residents, coordinator, volunteer } = await scene();
    const ids: number[] = [];
    for (const r of residents)
      ids.push((await r.client.post("/api/collection-requests").send({ forDate, bucketCount: 2 })).body.id);
    const plan = await coordinator.post("/api/collection-rounds/plan").send({ forDate });
    const round = plan.body.rounds.find((x: { volunteerId: number }) => x.volunteerId === volunteer.person.id);
    expect(round).toMatchObject({ stopCount: 3, loadKg: 30 });
    const before = (await volunteer.get(`/api/collection-rounds/${round.id}`)).body;

    // The farthest household (3 Sorrel Lane) cancels: 2 stops, 20 kg, and the round no longer rides out to it.
    expect((await residents[2]!.client.post(`/api/collection-requests/${ids[2]}/cancel`).send({})).status).toBe(200);
    const after = (await volunteer.get(`/api/collection-rounds/${round.id}`)).body;
    expect(after).toMatchObject({ stopCount: 2, loadKg: 20, status: "planned" });
    expect(after.stops.map((s: { addressText: string }) => s.addressText)).toEqual(["1 Sorrel Lane", "2 Sorrel Lane"]);
    // Start → stops → digester, as the sheet's own legs say.
    const legs = after.stops.reduce((sum: number, s: { legM: number }) => sum + s.legM, 0) + after.endLegM;
    expect(Math.abs(after.totalM - legs)).toBeLessThanOrEqual(2);
    expect(after.totalM).toBeLessThanOrEqual(before.totalM + 1e-6);

    await residents[0]!.client.post(`/api/collection-requests/${ids[0]}/cancel`).send({});
    await residents[1]!.client.post(`/api/collection-requests/${ids[1]}/cancel`).send({});
    const empty = (await coordinator.get(`/api/collection-rounds/${round.id}`)).body;
    expect(empty).toMatchObject({ stopCount: 0, loadKg: 0, status: "cancelled" });
  });

  it("re-planning replaces untouched rounds; a date without volunteers' room reports why", async () => {
    const { forDate, residents, coordinator, volunteer } = await scene();
    const requestIds: number[] = [];
    // The heavy one: 20 buckets × 5 kg = 100 kg, more than the scene volunteer's 40 kg bike.
    requestIds.push(
      (await residents[0]!.client.post("/api/collection-requests").send({ forDate, bucketCount: 20 })).body.id,
    );
    for (const r of residents.slice(1))
      requestIds.push((await r.client.post("/api/collection-requests").send({ forDate, bucketCount: 2 })).body.id);
    const heavyId = requestIds[0]!;
    const plan = await coordinator.post("/api/collection-rounds/plan").send({ forDate });
    expect(plan.status).toBe(200);
    // The date's untouched rounds (other tests' rounds on this day may be cancelled or have something collected: those stay).
    const oldIds = (plan.body.rounds as Round[])
      .filter((x) => x.status === "planned" && x.collectedCount === 0)
      .map((x) => x.id);
    expect(oldIds.length).toBeGreaterThan(0);

    const again = await coordinator.post("/api/collection-rounds/plan").send({ forDate });
    expect(again.status).toBe(200);
    const rounds = again.body.rounds as Round[];
    const unplaced = again.body.unplaced as Unplaced[];
    // Nothing was collected: every old round was replaced, in the answer and in the database.
    for (const id of oldIds) expect(rounds.map((x) => x.id)).not.toContain(id);
    expect(await sql(`SELECT id FROM collection_rounds WHERE id = ANY($1::int[])`, [oldIds])).toEqual([]);

    // Every request of ours is on exactly one of the date's rounds, or reported unplaced (and then open).
    const stops = await sql<{ round_id: number; request_id: number }>(
      `SELECT round_id, request_id FROM collection_round_stops WHERE request_id = ANY($1::int[])`,
      [requestIds],
    );
    const statuses = new Map(
      (
        await sql<{ id: number; status: string }>(
          `SELECT id, status FROM collection_requests WHERE id = ANY($1::int[])`,
          [requestIds],
        )
      ).map((r) => [r.id, r.status]),
    );
    for (const id of requestIds) {
      const on = stops.filter((s) => s.request_id === id);
      const isUnplaced = unplaced.some((u) => u.requestId === id);
      expect(on.length + (isUnplaced ? 1 : 0), `request ${id}`).toBe(1);
      if (isUnplaced) expect(statuses.get(id)).toBe("open");
      else {
        expect(statuses.get(id)).toBe("planned");
        expect(rounds.map((x) => x.id)).toContain(on[0]!.round_id);
      }
    }
    // The heavy request is never on the 40 kg bike: reported, or (other tests' volunteers) on a bike that carries 100 kg.
    const heavyOn = stops.find((s) => s.request_id === heavyId);
    const mine = rounds.filter((x) => x.volunteerId === volunteer.person.id).map((x) => x.id);
    expect(mine.length).toBeGreaterThan(0);
    if (heavyOn) {
      expect(mine).not.toContain(heavyOn.round_id);
      const round = rounds.find((x) => x.id === heavyOn.round_id)!;
      const [bike] = await sql<{ bike_load_kg: number }>(
        `SELECT bike_load_kg::float8 AS bike_load_kg FROM people WHERE id = $1`,
        [round.volunteerId],
      );
      expect(bike!.bike_load_kg).toBeGreaterThanOrEqual(100);
    } else {
      const u = unplaced.find((x) => x.requestId === heavyId)!;
      expect(u.householdName).toBe(residents[0]!.household.name);
      expect(u.message).toMatch(/cargo bike|room|volunteer/);
      expect(statuses.get(heavyId)).toBe("open");
    }
    const past = await coordinator.post("/api/collection-rounds/plan").send({ forDate: "2020-01-01" });
    expect(past.status).toBe(400);
  });

  it("a plan of several rounds stores each round with its own stops, in order", async () => {
    const a = await scene();
    const b = await scene(a.forDate);
    const requestIds: number[] = [];
    for (const [i, r] of [...a.residents, ...b.residents].entries()) {
      const res = await r.client
        .post("/api/collection-requests")
        .send({ forDate: a.forDate, bucketCount: 1 + (i % 3) });
      expect(res.status).toBe(201);
      requestIds.push(res.body.id);
    }
    const plan = await a.coordinator.post("/api/collection-rounds/plan").send({ forDate: a.forDate });
    expect(plan.status).toBe(200);
    const rounds = (plan.body.rounds as Round[]).filter((x) => x.status === "planned" && x.collectedCount === 0);
    for (const s of [a, b]) expect(rounds.map((x) => x.volunteerId)).toContain(s.volunteer.person.id);
    // Each new round's stops are its own: seq 1…n, as many as it says, weighing what it says.
    for (const round of rounds) {
      const sheet = (await a.coordinator.get(`/api/collection-rounds/${round.id}`)).body;
      expect(sheet.stops.map((x: { seq: number }) => x.seq)).toEqual(
        Array.from({ length: round.stopCount }, (_, i) => i + 1),
      );
      expect(round.loadKg).toBe(
        sheet.stops.reduce((sum: number, x: { bucketCount: number }) => sum + x.bucketCount * 5, 0),
      );
      expect(sheet.stops.every((x: { status: string }) => x.status === "planned")).toBe(true);
    }
    // Each of our requests is on one round, or reported.
    const on = await sql<{ request_id: number }>(
      `SELECT request_id FROM collection_round_stops WHERE request_id = ANY($1::int[])`,
      [requestIds],
    );
    for (const id of requestIds) {
      const placed = on.filter((x) => x.request_id === id).length;
      const reported = (plan.body.unplaced as Unplaced[]).filter((u) => u.requestId === id).length;
      expect(placed + reported, `request ${id}`).toBe(1);
    }
    // The households of a scene are planned on its own volunteer's round, nearest first.
    for (const s of [a, b]) {
      const round = rounds.find((x) => x.volunteerId === s.volunteer.person.id)!;
      const sheet = (await s.volunteer.get(`/api/collection-rounds/${round.id}`)).body;
      const ours = s.residents.map((r) => r.household.id);
      const order = sheet.stops
        .map((x: { householdId: number }) => x.householdId)
        .filter((id: number) => ours.includes(id));
      expect(order.length).toBeGreaterThan(0);
      expect(order).toEqual(ours.filter((id) => order.includes(id)));
    }
  });

  it("room on a later date counts the drop-offs already pending there", async () => {
    const forDate = addDays(today(), 3);
    const { digester, residents, coordinator } = await scene(forDate);
    // 450 kg of scraps already pending at the digester on that day: more than a 10 m³ digester takes in a day.
    await sql(
      `INSERT INTO drop_offs (household_id, digester_id, for_date, bucket_count, bucket_litres, mass_source, fresh_kg, kg_vs, status)
       VALUES ($1, $2, $3, 15, 60, 'estimated', 450, 81, 'pending')`,
      [residents[0]!.household.id, digester.id, forDate],
    );
    const ids: number[] = [];
    for (const r of residents)
      ids.push((await r.client.post("/api/collection-requests").send({ forDate, bucketCount: 2 })).body.id);
    const plan = await coordinator.post("/api/collection-rounds/plan").send({ forDate });
    expect(plan.status).toBe(200);
    expect((plan.body.rounds as Round[]).filter((x) => x.endDigesterId === digester.id)).toEqual([]);
    const unplaced = plan.body.unplaced as Unplaced[];
    for (const id of ids) expect(unplaced.find((u) => u.requestId === id)?.reason).toMatch(/^noDigester/);
  });

  it("a re-plan leaves room for the stops still to collect on rounds it keeps", async () => {
    const forDate = addDays(today(), 2);
    const { digester, residents, coordinator, volunteer, spot } = await scene(forDate);
    for (const r of residents)
      expect((await r.client.post("/api/collection-requests").send({ forDate, bucketCount: 2 })).status).toBe(201);
    const plan = await coordinator.post("/api/collection-rounds/plan").send({ forDate });
    const round = (plan.body.rounds as Round[]).find((x) => x.volunteerId === volunteer.person.id)!;
    expect(round).toMatchObject({ endDigesterId: digester.id, stopCount: 3, loadKg: 30 });

    // The first stop is collected (as markCollected writes it): the round is kept, 20 kg still to come.
    const [first] = await sql<{ request_id: number; household_id: number }>(
      `SELECT s.request_id, c.household_id FROM collection_round_stops s JOIN collection_requests c ON c.id = s.request_id
        WHERE s.round_id = $1 ORDER BY s.seq LIMIT 1`,
      [round.id],
    );
    const [dropOff] = await sql<{ id: number }>(
      `INSERT INTO drop_offs (household_id, digester_id, for_date, bucket_count, bucket_litres, mass_source, fresh_kg, kg_vs, status)
       VALUES ($1, $2, $3, 2, 10, 'estimated', 10, 1.8, 'pending') RETURNING id`,
      [first!.household_id, digester.id, forDate],
    );
    await sql(
      `UPDATE collection_round_stops SET drop_off_id = $1 WHERE round_id = $2 AND request_id = $3 RETURNING round_id`,
      [dropOff!.id, round.id, first!.request_id],
    );
    await sql(`UPDATE collection_requests SET status = 'collected' WHERE id = $1 RETURNING id`, [first!.request_id]);

    // Fill the day so that 5 kg is left once the collected 10 kg and the 20 kg still on the round are counted.
    const [state] = await loadDigestersToday([digester.id]);
    const room = roomOnDateKg(state!, forDate, { pendingKg: 0, plannedKg: 0 });
    expect(room).toBeGreaterThan(45);
    await sql(
      `INSERT INTO drop_offs (household_id, digester_id, for_date, weight_kg, mass_source, fresh_kg, kg_vs, status)
       VALUES ($1, $2, $3, $4, 'weighed', $4, 1, 'pending')`,
      [residents[2]!.household.id, digester.id, forDate, Math.round((room - 35) * 100) / 100],
    );
    // A fourth household asks for 10 kg: it does not fit.
    const h = await createHousehold({ lat: spot.lat + 0.0015, lng: spot.lng });
    const [late] = await sql<{ id: number }>(
      `INSERT INTO collection_requests (household_id, for_date, bucket_count) VALUES ($1, $2, 2) RETURNING id`,
      [h.id, forDate],
    );
    const again = await coordinator.post("/api/collection-rounds/plan").send({ forDate });
    expect(again.status).toBe(200);
    const rounds = again.body.rounds as Round[];
    expect(rounds.find((x) => x.id === round.id)).toMatchObject({ stopCount: 3, loadKg: 30, status: "planned" });
    expect(rounds.filter((x) => x.endDigesterId === digester.id).map((x) => x.id)).toEqual([round.id]);
    expect((again.body.unplaced as Unplaced[]).find((u) => u.requestId === late!.id)?.reason).toMatch(/^noDigester/);
  });

  it("a re-plan waits for a stop being marked collected and keeps that round", async () => {
    const { forDate, residents, coordinator, volunteer, digester } = await scene();
    for (const r of residents)
      expect((await r.client.post("/api/collection-requests").send({ forDate, bucketCount: 2 })).status).toBe(201);
    const plan = await coordinator.post("/api/collection-rounds/plan").send({ forDate });
    const round = (plan.body.rounds as Round[]).find((x) => x.volunteerId === volunteer.person.id)!;
    const before = await stopsOf([round.id]);
    expect(before.length).toBeGreaterThan(1);
    const [first] = await sql<{ request_id: number; household_id: number }>(
      `SELECT s.request_id, c.household_id FROM collection_round_stops s JOIN collection_requests c ON c.id = s.request_id
        WHERE s.round_id = $1 ORDER BY s.seq LIMIT 1`,
      [round.id],
    );

    // A collection in flight, taking its locks as markCollected does (the round, then the request), not yet committed.
    const t = await sequelize().transaction();
    let replanning: Promise<{ status: number; body: { rounds: Round[] } }> | undefined;
    try {
      const run = async (query: string, bind: unknown[]) =>
        (await sequelize().query(query, { bind, transaction: t, type: QueryTypes.SELECT })) as Record<string, number>[];
      const [{ pid }] = (await run(`SELECT pg_backend_pid() AS pid`, [])) as [{ pid: number }];
      await run(`SELECT id FROM collection_rounds WHERE id = $1 FOR UPDATE`, [round.id]);
      await run(`SELECT id FROM collection_requests WHERE id = $1 FOR UPDATE`, [first!.request_id]);
      const [{ id: dropOffId }] = (await run(
        `INSERT INTO drop_offs (household_id, digester_id, for_date, bucket_count, bucket_litres, mass_source, fresh_kg, kg_vs, status)
         VALUES ($1, $2, $3, 2, 10, 'estimated', 10, 1.8, 'pending') RETURNING id`,
        [first!.household_id, digester.id, forDate],
      )) as [{ id: number }];
      await run(
        `UPDATE collection_round_stops SET drop_off_id = $1 WHERE round_id = $2 AND request_id = $3 RETURNING round_id`,
        [dropOffId, round.id, first!.request_id],
      );
      await run(`UPDATE collection_requests SET status = 'collected' WHERE id = $1 RETURNING id`, [first!.request_id]);

      replanning = coordinator
        .post("/api/collection-rounds/plan")
        .send({ forDate })
        .then((res) => res);
      // Wait until the re-plan is blocked by the collection's locks.
      const deadline = Date.now() + 10_000;
      for (;;) {
        const [{ waiting }] = (await sql<{ waiting: number }>(
          `SELECT count(*)::int AS waiting FROM pg_stat_activity WHERE $1::int = ANY(pg_blocking_pids(pid))`,
          [pid],
        )) as [{ waiting: number }];
        if (waiting > 0) break;
        if (Date.now() > deadline) throw new Error("The re-plan never waited for the collection's locks.");
        await new Promise((resolve) => setTimeout(resolve, 20));
      }
    } finally {
      await t.commit();
    }
    const again = await replanning!;
    expect(again.status).toBe(200);
    // The round with a collected stop is kept whole: the collection is not lost, its other stops still ride with it.
    expect(again.body.rounds.find((x) => x.id === round.id)).toMatchObject({
      stopCount: before.length,
      collectedCount: 1,
    });
    expect(await stopsOf([round.id])).toEqual(before);
    const statuses = await sql<{ status: string }>(
      `SELECT c.status FROM collection_round_stops s JOIN collection_requests c ON c.id = s.request_id WHERE s.round_id = $1 ORDER BY s.seq`,
      [round.id],
    );
    expect(statuses.map((x) => x.status)).toEqual(["collected", ...before.slice(1).map(() => "planned")]);
  });

  it("a stop is collected only on its round's day, at a digester still open, by the round's volunteer", async () => {
    // A later day: not yet.
    const later = await scene();
    for (const r of later.residents)
      await r.client.post("/api/collection-requests").send({ forDate: later.forDate, bucketCount: 2 });
    const laterPlan = await later.coordinator.post("/api/collection-rounds/plan").send({ forDate: later.forDate });
    const laterRound = (laterPlan.body.rounds as Round[]).find((x) => x.volunteerId === later.volunteer.person.id)!;
    const laterSheet = (await later.volunteer.get(`/api/collection-rounds/${laterRound.id}`)).body;
    const early = await later.volunteer
      .post(`/api/collection-rounds/${laterRound.id}/stops/${laterSheet.stops[0].requestId}/collected`)
      .send({});
    expect(early.status).toBe(409);
    expect(early.body.error.code).toBe("not_yet");
    expect(early.body.error.message).toContain(later.forDate);
    expect(
      await collectionTrace(
        later.residents.map((r) => r.household.id),
        laterRound.id,
      ),
    ).toEqual({ drop_offs: 0, collected: 0, linked: 0 });

    // Today, but by another volunteer: forbidden, nothing written.
    const s = await scene(today());
    for (const r of s.residents)
      await r.client.post("/api/collection-requests").send({ forDate: s.forDate, bucketCount: 2 });
    const plan = await s.coordinator.post("/api/collection-rounds/plan").send({ forDate: s.forDate });
    const round = (plan.body.rounds as Round[]).find((x) => x.volunteerId === s.volunteer.person.id)!;
    const sheet = (await s.volunteer.get(`/api/collection-rounds/${round.id}`)).body;
    const stopPath = `/api/collection-rounds/${round.id}/stops/${sheet.stops[0].requestId}/collected`;
    const households = s.residents.map((r) => r.household.id);
    const other = await signedInClient(app, { roles: ["resident"], isVolunteer: true, bikeLoadKg: 60 });
    const theirs = await other.post(stopPath).send({});
    expect(theirs.status).toBe(403);
    expect(await collectionTrace(households, round.id)).toEqual({ drop_offs: 0, collected: 0, linked: 0 });

    // Today, the round's volunteer, but the end digester has since gone to rest: ask for a re-plan.
    await sql(`UPDATE digesters SET status = 'resting', status_reason = 'test' WHERE id = $1 RETURNING id`, [
      s.digester.id,
    ]);
    const resting = await s.volunteer.post(stopPath).send({});
    expect(resting.status).toBe(409);
    expect(resting.body.error.message).toMatch(/re-plan/);
    expect(await collectionTrace(households, round.id)).toEqual({ drop_offs: 0, collected: 0, linked: 0 });

    // Open again: collected.
    await sql(`UPDATE digesters SET status = 'active', status_reason = NULL WHERE id = $1 RETURNING id`, [
      s.digester.id,
    ]);
    expect((await s.volunteer.post(stopPath).send({})).status).toBe(200);
    expect(await collectionTrace(households, round.id)).toEqual({ drop_offs: 1, collected: 1, linked: 1 });
  });

  it("GeoJSON leaves out the route when fewer than two positions are left", async () => {
    const { forDate, residents, coordinator, volunteer } = await scene();
    const ids: number[] = [];
    for (const r of residents)
      ids.push((await r.client.post("/api/collection-requests").send({ forDate, bucketCount: 2 })).body.id);
    const plan = await coordinator.post("/api/collection-rounds/plan").send({ forDate });
    const round = (plan.body.rounds as Round[]).find((x) => x.volunteerId === volunteer.person.id)!;
    // The volunteer's start point is removed and every household cancels: only the end digester is left.
    await sql(`UPDATE people SET start_lat = NULL, start_lng = NULL WHERE id = $1 RETURNING id`, [volunteer.person.id]);
    for (const [i, r] of residents.entries())
      expect((await r.client.post(`/api/collection-requests/${ids[i]}/cancel`).send({})).status).toBe(200);
    const geo = await coordinator.get(`/api/collection-rounds/${round.id}/geojson`);
    expect(geo.status).toBe(200);
    const fc = JSON.parse(geo.text);
    expect(fc.type).toBe("FeatureCollection");
    for (const f of fc.features) {
      // RFC 7946 §3.1.4: a LineString has two or more positions.
      if (f.geometry.type === "LineString") expect(f.geometry.coordinates.length).toBeGreaterThanOrEqual(2);
    }
    expect(fc.features.map((f: { properties: { kind: string } }) => f.properties.kind)).toEqual(["endDigester"]);
  });
});
