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
  await sql(`INSERT INTO readings (digester_id, taken_at, temperature_c, ph) VALUES ($1, now() - interval '1 hour', 30, 7.1)`, [d.id]);
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
    const mail = await sql<{ subject: string }>(`SELECT subject FROM outbox_emails WHERE to_address = $1`, [resident.email]);
    expect(mail.map((m) => m.subject)).toEqual([expect.stringContaining(near.name)]);

    // Moving it where it already is counts as no move and writes no e-mail.
    const same = await coordinator.post("/api/rebalancing/moves").send({ moves: [{ dropOffId, digesterId: near.id }] });
    expect(same.body).toEqual({ moved: 0, emailsQueued: 0 });

    await sql(`UPDATE drop_offs SET status = 'cancelled' WHERE id = $1`, [dropOffId]);
    const again = await coordinator.post("/api/rebalancing/moves").send({ moves: [{ dropOffId, digesterId: near.id }] });
    expect(again.status).toBe(409);
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
    const rows = await sql<{ digester_id: number }>(`SELECT digester_id FROM drop_offs WHERE id = ANY($1::int[])`, [[dropOffId, second]]);
    expect(rows.every((r) => r.digester_id === offline.id)).toBe(true);
  });
});
