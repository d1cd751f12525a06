import { describe, expect, it } from "vitest";
import { createApp } from "../../server/app";
import { localDate } from "../../server/lib/clock";
import { createDigester, createHousehold, createPerson, signedInClient, sql } from "../helpers/db";

const app = createApp({ requestLogging: false });

function remoteSpot() {
  return { lat: -30 - Math.random() * 20, lng: 100 + Math.random() * 40 };
}

async function warmDigester(at: { lat: number; lng: number }) {
  const d = await createDigester({ ...at, workingVolumeM3: 2 });
  await sql(
    `INSERT INTO readings (digester_id, taken_at, temperature_c, ph) VALUES ($1, now() - interval '1 hour', 30, 7.1)`,
    [d.id],
  );
  return d;
}

async function pendingDropOff(householdId: number, digesterId: number, freshKg = 2) {
  const [row] = await sql<{ id: number }>(
    `INSERT INTO drop_offs (household_id, digester_id, for_date, weight_kg, mass_source, fresh_kg, kg_vs, status)
     VALUES ($1, $2, $3, $4, 'weighed', $4, $4 * 0.2262, 'pending') RETURNING id`,
    [householdId, digesterId, localDate(new Date()), freshKg],
  );
  return row!.id;
}

async function scene() {
  const spot = remoteSpot();
  const offline = await createDigester({ ...spot, status: "offline" });
  // 0.01° of latitude ≈ 1,112 m, 0.02° ≈ 2,224 m (π R / 180 per degree [derived, shared/domain/geo.ts]).
  const near = await warmDigester({ lat: spot.lat + 0.01, lng: spot.lng });
  const far = await warmDigester({ lat: spot.lat + 0.02, lng: spot.lng });
  const household = await createHousehold({ ...spot, assignedDigesterId: offline.id });
  const resident = await createPerson({ roles: ["resident"], householdId: household.id });
  const dropOffId = await pendingDropOff(household.id, offline.id);
  return { offline, near, far, household, resident, dropOffId };
}

describe("rebalancing today", () => {
  it("lists pending drop-offs at an offline digester with the nearest digesters that have room", async () => {
    const { offline, near, far, dropOffId } = await scene();
    const coordinator = await signedInClient(app, { roles: ["coordinator"] });
    const res = await coordinator.get("/api/rebalancing");
    expect(res.status).toBe(200);
    const item = res.body.items.find((i: { dropOffId: number }) => i.dropOffId === dropOffId);
    expect(item).toMatchObject({ digesterId: offline.id, freshKg: 2 });
    expect(item.why).toMatch(/offline/);
    expect(item.suggestions.map((s: { digesterId: number }) => s.digesterId).slice(0, 2)).toEqual([near.id, far.id]);
    expect(item.suggestions[0].distanceM).toBeGreaterThan(1000);
    expect(item.suggestions[0].distanceM).toBeLessThan(1250);
  });

  it("lists a drop-off whose digester's budget today is below the pending load", async () => {
    const spot = remoteSpot();
    const small = await warmDigester(spot);
    const household = await createHousehold({ ...spot, assignedDigesterId: small.id });
    // 2 m³ at 30 °C take a few kg a day at most (organic limit 1.5 kg VS/m³/d); 150 kg is far beyond it.
    const id = await pendingDropOff(household.id, small.id, 150);
    const coordinator = await signedInClient(app, { roles: ["coordinator"] });
    const res = await coordinator.get("/api/rebalancing");
    const item = res.body.items.find((i: { dropOffId: number }) => i.dropOffId === id);
    expect(item.why).toMatch(/can take .* but 150\.0 kg is waiting/);
  });

  it("moves a drop-off, tells the resident, and refuses to move it again once it is not pending", async () => {
    const { near, resident, dropOffId } = await scene();
    const coordinator = await signedInClient(app, { roles: ["coordinator"] });
    const res = await coordinator.post("/api/rebalancing/moves").send({ moves: [{ dropOffId, digesterId: near.id }] });
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ moved: 1, emailsQueued: 1 });
    const [row] = await sql<{ digester_id: number }>(`SELECT digester_id FROM drop_offs WHERE id = $1`, [dropOffId]);
    expect(row!.digester_id).toBe(near.id);
    const mail = await sql<{ subject: string }>(`SELECT subject FROM outbox_emails WHERE to_address = $1`, [
      resident.email,
    ]);
    expect(mail.map((m) => m.subject)).toEqual([expect.stringContaining(near.name)]);

    // Moving it where it already is counts as no move and writes no e-mail.
    const same = await coordinator.post("/api/rebalancing/moves").send({ moves: [{ dropOffId, digesterId: near.id }] });
    expect(same.body).toEqual({ moved: 0, emailsQueued: 0 });

    await sql(`UPDATE drop_offs SET status = 'cancelled' WHERE id = $1`, [dropOffId]);
    const again = await coordinator
      .post("/api/rebalancing/moves")
      .send({ moves: [{ dropOffId, digesterId: near.id }] });
    expect(again.status).toBe(409);
    expect(again.body.error.fields).toEqual({ "moves.0.dropOffId": expect.any(String) });

    const missing = await coordinator
      .post("/api/rebalancing/moves")
      .send({ moves: [{ dropOffId: 2_000_000_000, digesterId: near.id }] });
    expect(missing.status).toBe(404);
    expect(missing.body.error.fields).toEqual({ "moves.0.dropOffId": expect.any(String) });
  });

  it("a move to an offline digester is refused and nothing of the batch moves", async () => {
    const { offline, near, household, dropOffId } = await scene();
    const second = await pendingDropOff(household.id, offline.id, 1);
    const resting = await createDigester({ status: "resting" });
    const coordinator = await signedInClient(app, { roles: ["coordinator"] });
    const res = await coordinator.post("/api/rebalancing/moves").send({
      moves: [
        { dropOffId, digesterId: near.id },
        { dropOffId: second, digesterId: resting.id },
      ],
    });
    expect(res.status).toBe(409);
    expect(res.body.error.fields).toEqual({ "moves.1.digesterId": expect.any(String) });
    const rows = await sql<{ digester_id: number }>(`SELECT digester_id FROM drop_offs WHERE id = ANY($1::int[])`, [
      [dropOffId, second],
    ]);
    expect(rows.every((r) => r.digester_id === offline.id)).toBe(true);
  });

  it("suggests first targets that fit together, so moving all to their first suggestions succeeds", async () => {
    const { offline, near, far, household, dropOffId } = await scene();
    const coordinator = await signedInClient(app, { roles: ["coordinator"] });
    // `near` has room for one 2 kg drop-off but not two (a warm 2 m³ takes ~3.3 kg today); should the
    // budget grow, a pending drop-off there takes all but ~3 kg.
    const before = await coordinator.get("/api/rebalancing");
    const first = before.body.items.find((i: { dropOffId: number }) => i.dropOffId === dropOffId).suggestions[0];
    expect(first.digesterId).toBe(near.id);
    const filler = Math.round((first.roomKg - 3) * 10) / 10;
    if (filler > 0) {
      const nearHousehold = await createHousehold({ lat: 0, lng: 0, assignedDigesterId: near.id });
      await pendingDropOff(nearHousehold.id, near.id, filler);
    }
    const second = await pendingDropOff(household.id, offline.id, 2);

    const res = await coordinator.get("/api/rebalancing");
    const items = [dropOffId, second].map((id) =>
      res.body.items.find((i: { dropOffId: number }) => i.dropOffId === id),
    );
    expect(items.map((i) => i.suggestions[0].digesterId)).toEqual([near.id, far.id]);
    // `near` is still offered to the second one only if it has room after the first: it has not.
    expect(items[1].suggestions.map((s: { digesterId: number }) => s.digesterId)).not.toContain(near.id);

    const moves = items.map((i) => ({ dropOffId: i.dropOffId, digesterId: i.suggestions[0].digesterId }));
    const moved = await coordinator.post("/api/rebalancing/moves").send({ moves });
    expect(moved.status).toBe(200);
    expect(moved.body).toEqual({ moved: 2, emailsQueued: 2 });
    const rows = await sql<{ id: number; digester_id: number }>(
      `SELECT id, digester_id FROM drop_offs WHERE id = ANY($1::int[]) ORDER BY id`,
      [[dropOffId, second]],
    );
    expect(rows.map((r) => r.digester_id)).toEqual([near.id, far.id]);
  });

  it("leaves out a drop-off collected on a round (its buckets are already there) and refuses to move it", async () => {
    const { offline, near, household, resident, dropOffId } = await scene();
    // A volunteer collected 3 kg from the household on a round ending at `offline` (before it went offline).
    const collected = await pendingDropOff(household.id, offline.id, 3);
    const volunteer = await createPerson({ roles: ["resident"], isVolunteer: true });
    const [request] = await sql<{ id: number }>(
      `INSERT INTO collection_requests (household_id, for_date, bucket_count, status) VALUES ($1, $2, 1, 'collected') RETURNING id`,
      [household.id, localDate(new Date())],
    );
    const [round] = await sql<{ id: number }>(
      `INSERT INTO collection_rounds (for_date, volunteer_id, end_digester_id, total_m, load_kg, status) VALUES ($1, $2, $3, 500, 3, 'done') RETURNING id`,
      [localDate(new Date()), volunteer.id, offline.id],
    );
    await sql(`INSERT INTO collection_round_stops (round_id, request_id, seq, drop_off_id) VALUES ($1, $2, 1, $3)`, [
      round!.id,
      request!.id,
      collected,
    ]);

    const coordinator = await signedInClient(app, { roles: ["coordinator"] });
    const res = await coordinator.get("/api/rebalancing");
    const listed = res.body.items.map((i: { dropOffId: number }) => i.dropOffId);
    expect(listed).toContain(dropOffId);
    expect(listed).not.toContain(collected);
    // It still counts as waiting at its digester.
    expect(res.body.digesters.find((d: { id: number }) => d.id === offline.id)).toMatchObject({ pendingKg: 5 });

    const move = await coordinator.post("/api/rebalancing/moves").send({
      moves: [
        { dropOffId, digesterId: near.id },
        { dropOffId: collected, digesterId: near.id },
      ],
    });
    expect(move.status).toBe(409);
    expect(move.body.error.message).toMatch(/collected on a collection round/);
    expect(move.body.error.fields).toEqual({ "moves.1.dropOffId": expect.any(String) });
    const rows = await sql<{ digester_id: number }>(`SELECT digester_id FROM drop_offs WHERE id = ANY($1::int[])`, [
      [dropOffId, collected],
    ]);
    expect(rows.map((r) => r.digester_id)).toEqual([offline.id, offline.id]);
    expect(await sql(`SELECT 1 FROM outbox_emails WHERE to_address = $1`, [resident.email])).toEqual([]);
  });
});
