import { describe, expect, it } from "vitest";
import { createApp } from "../../server/app";
import { streetsFromGeoJson, listStreets } from "../../server/modules/streets/streets.service";
import { METRES_PER_DEGREE_LATITUDE } from "../../shared/domain/geo";
import { createDigester, createHousehold, createPerson, signedInClient, sql, uniqueEmail } from "../helpers/db";

const app = createApp({ requestLogging: false });

/** A spot of our own, far from the other tests' digesters (they sit at 51.5, −0.1 by default). */
function remoteSpot() {
  return { lat: -30 - Math.random() * 20, lng: 100 + Math.random() * 40 };
}

const count = async (query: string, bind: unknown[] = []) =>
  Number((await sql<{ count: string }>(query, bind))[0]!.count);

describe("registering a household", () => {
  it("when a resident without a household registers one, then they are its member and the nearest active digester is its default", async () => {
    const spot = remoteSpot();
    // 0.01° of latitude ≈ 1,112 m and 0.02° ≈ 2,224 m (π R / 180 per degree [derived, shared/domain/geo.ts]).
    const near = await createDigester({ lat: spot.lat + 0.01, lng: spot.lng });
    await createDigester({ lat: spot.lat + 0.02, lng: spot.lng });
    await createDigester({ lat: spot.lat + 0.001, lng: spot.lng, status: "resting" });
    const resident = await signedInClient(app, { roles: ["resident"] });

    const before = await resident.get("/api/households/mine");
    expect(before.status).toBe(200);
    expect(before.body).toEqual({ household: null });

    const res = await resident
      .post("/api/households")
      .send({ name: "  The Quillfoot House ", addressText: "4 Tansy Row", location: spot });
    expect(res.status).toBe(201);
    const h = res.body.household;
    expect(h).toMatchObject({
      name: "The Quillfoot House",
      addressText: "4 Tansy Row",
      location: spot,
      declaredWeeklyKg: 3,
    });
    expect(h.digester).toMatchObject({ id: near.id, source: "nearest" });
    expect(h.digester.distanceM).toBeCloseTo(0.01 * METRES_PER_DEGREE_LATITUDE, -1);
    expect(h.members).toEqual([{ id: resident.person.id, name: resident.person.name, status: "active", isYou: true }]);

    const [person] = await sql<{ household_id: number }>(`SELECT household_id FROM people WHERE id = $1`, [
      resident.person.id,
    ]);
    expect(person!.household_id).toBe(h.id);
    // The default is computed, not stored: the coordinator's scheduler still sees the household as unassigned.
    const [row] = await sql<{ assigned_digester_id: number | null }>(
      `SELECT assigned_digester_id FROM households WHERE id = $1`,
      [h.id],
    );
    expect(row!.assigned_digester_id).toBeNull();

    const again = await resident.get("/api/households/mine");
    expect(again.body.household.id).toBe(h.id);
  });

  it("when the resident already belongs to a household, then registering another is a 409 and writes nothing", async () => {
    const home = await createHousehold();
    const resident = await signedInClient(app, { roles: ["resident"], householdId: home.id });
    const name = `Second home ${Math.random()}`;
    const res = await resident.post("/api/households").send({ name, location: remoteSpot() });
    expect(res.status).toBe(409);
    expect(await count(`SELECT count(*) FROM households WHERE name = $1`, [name])).toBe(0);
  });

  it.each([
    ["an empty name", { name: "   ", location: { lat: 1, lng: 1 } }, "name"],
    ["a latitude beyond 90°", { name: "Ok", location: { lat: 95, lng: 1 } }, "location.lat"],
    ["no location", { name: "Ok" }, "location"],
    [
      "an address over 200 characters",
      { name: "Ok", addressText: "x".repeat(201), location: { lat: 1, lng: 1 } },
      "addressText",
    ],
    [
      "a digester it may not choose",
      { name: "Ok", location: { lat: 1, lng: 1 }, assignedDigesterId: 1 },
      "assignedDigesterId",
    ],
  ])("when the body has %s, then it is a 400 naming that field and nothing is written", async (_what, body, field) => {
    const resident = await signedInClient(app, { roles: ["resident"] });
    const res = await resident.post("/api/households").send(body);
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields)).toContain(field);
    const [person] = await sql<{ household_id: number | null }>(`SELECT household_id FROM people WHERE id = $1`, [
      resident.person.id,
    ]);
    expect(person!.household_id).toBeNull();
  });

  it("when someone without the resident role registers, then it is a 403", async () => {
    const steward = await signedInClient(app, { roles: ["steward"] });
    const res = await steward.post("/api/households").send({ name: "Not mine", location: remoteSpot() });
    expect(res.status).toBe(403);
  });

  it("when a coordinator has assigned a digester, then the household shows it as assigned, even when resting", async () => {
    const spot = remoteSpot();
    const assigned = await createDigester({ lat: spot.lat + 0.05, lng: spot.lng, status: "resting" });
    await createDigester({ lat: spot.lat, lng: spot.lng });
    const home = await createHousehold({ assignedDigesterId: assigned.id, ...spot });
    const resident = await signedInClient(app, { roles: ["resident"], householdId: home.id });
    const res = await resident.get("/api/households/mine");
    expect(res.body.household.digester).toMatchObject({ id: assigned.id, name: assigned.name, source: "assigned" });
  });
});

describe("changing the household", () => {
  it("when a member changes the address and location, then they are saved", async () => {
    const home = await createHousehold();
    const resident = await signedInClient(app, { roles: ["resident"], householdId: home.id });
    const spot = remoteSpot();
    const res = await resident
      .patch("/api/households/mine")
      .send({ addressText: "9 Wicket Lane", location: spot, declaredWeeklyKg: 4.5 });
    expect(res.status).toBe(200);
    expect(res.body.household).toMatchObject({ addressText: "9 Wicket Lane", location: spot, declaredWeeklyKg: 4.5 });
    const [row] = await sql<{ address_text: string; lat: number }>(
      `SELECT address_text, lat FROM households WHERE id = $1`,
      [home.id],
    );
    expect(row).toEqual({ address_text: "9 Wicket Lane", lat: spot.lat });
  });

  it("when a member tries to set the assigned digester, then it is a 400 and nothing changes", async () => {
    const d = await createDigester();
    const home = await createHousehold();
    const resident = await signedInClient(app, { roles: ["resident"], householdId: home.id });
    const res = await resident.patch("/api/households/mine").send({ assignedDigesterId: d.id });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toHaveProperty("assignedDigesterId");
    const [row] = await sql<{ assigned_digester_id: number | null }>(
      `SELECT assigned_digester_id FROM households WHERE id = $1`,
      [home.id],
    );
    expect(row!.assigned_digester_id).toBeNull();
  });

  it("when a resident without a household changes it, then it is a 409 asking them to register", async () => {
    const resident = await signedInClient(app, { roles: ["resident"] });
    const res = await resident.patch("/api/households/mine").send({ name: "Anything" });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe("household_required");
  });
});

describe("adding members", () => {
  it("when a member invites someone new by e-mail, then an invited resident of the same household, an invitation and an e-mail are written", async () => {
    const home = await createHousehold();
    const resident = await signedInClient(app, { roles: ["resident"], householdId: home.id });
    const email = uniqueEmail("partner");
    const res = await resident.post("/api/households/mine/members").send({ email, name: "Odile Brackenbury" });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ email, personId: expect.any(Number), expiresAt: expect.any(String) });
    const [person] = await sql<{ status: string; roles: string[]; household_id: number; name: string }>(
      `SELECT status, roles, household_id, name FROM people WHERE email = $1`,
      [email],
    );
    expect(person).toEqual({
      status: "invited",
      roles: ["resident"],
      household_id: home.id,
      name: "Odile Brackenbury",
    });
    expect(
      await count(`SELECT count(*) FROM invitations WHERE email = $1 AND invited_by = $2`, [email, resident.person.id]),
    ).toBe(1);
    expect(await count(`SELECT count(*) FROM outbox_emails WHERE to_address = $1`, [email])).toBe(1);

    const mine = await resident.get("/api/households/mine");
    const names = mine.body.household.members.map((m: { name: string; status: string }) => `${m.name}:${m.status}`);
    expect(names).toContain("Odile Brackenbury:invited");
    // Members are listed by name and status only: nobody else's e-mail address is sent.
    expect(JSON.stringify(mine.body)).not.toContain(email);
  });

  it("when the address already has an account, then it is a 409 and that person's roles and household stay as they were", async () => {
    const coordinator = await createPerson({ roles: ["coordinator", "steward"] });
    const home = await createHousehold();
    const resident = await signedInClient(app, { roles: ["resident"], householdId: home.id });
    const res = await resident.post("/api/households/mine/members").send({ email: coordinator.email.toUpperCase() });
    expect(res.status).toBe(409);
    expect(res.body.error.fields).toHaveProperty("email");
    const [after] = await sql<{ roles: string[]; household_id: number | null }>(
      `SELECT roles, household_id FROM people WHERE id = $1`,
      [coordinator.id],
    );
    expect(after).toEqual({ roles: ["coordinator", "steward"], household_id: null });
  });

  it("when the e-mail is malformed, then it is a 400 naming the field and no person is written", async () => {
    const home = await createHousehold();
    const resident = await signedInClient(app, { roles: ["resident"], householdId: home.id });
    const before = await count(`SELECT count(*) FROM people WHERE household_id = $1`, [home.id]);
    const res = await resident.post("/api/households/mine/members").send({ email: "not-an-address" });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toHaveProperty("email");
    expect(await count(`SELECT count(*) FROM people WHERE household_id = $1`, [home.id])).toBe(before);
  });

  it("when the same new address is invited twice at once, then exactly one invitation is written and the other is a 409", async () => {
    const home = await createHousehold();
    const resident = await signedInClient(app, { roles: ["resident"], householdId: home.id });
    const email = uniqueEmail("twice");
    const answers = await Promise.all(
      [0, 1, 2].map(() => resident.post("/api/households/mine/members").send({ email })),
    );
    expect(answers.map((a) => a.status).sort()).toEqual([201, 409, 409]);
    expect(await count(`SELECT count(*) FROM people WHERE email = $1`, [email])).toBe(1);
    expect(await count(`SELECT count(*) FROM invitations WHERE email = $1`, [email])).toBe(1);
  });
});

describe("who sees which households", () => {
  it("when a coordinator lists households, then they see others' households with locations; a resident sees only their own", async () => {
    const spot = remoteSpot();
    const mine = await createHousehold(spot);
    const theirs = await createHousehold(remoteSpot());
    const resident = await signedInClient(app, { roles: ["resident"], householdId: mine.id });
    const coordinator = await signedInClient(app, { roles: ["coordinator"] });

    const own = await resident.get("/api/households");
    expect(own.status).toBe(200);
    expect(own.body).toEqual([expect.objectContaining({ id: mine.id, location: spot, isMine: true, memberCount: 1 })]);

    const all = await coordinator.get("/api/households");
    const ids = all.body.map((h: { id: number }) => h.id);
    expect(ids).toEqual(expect.arrayContaining([mine.id, theirs.id]));

    const stranger = await signedInClient(app, { roles: ["gardener"] });
    expect((await stranger.get("/api/households")).body).toEqual([]);
  });
});

describe("the street list", () => {
  it("when the basemap is read, then every named street of it is listed once, each with a point on the street", async () => {
    // The street names of the demo basemap are the LARKMOOR_STREETS of server/db/seeders/demo/place.ts.
    const { LARKMOOR_STREETS } = await import("../../server/db/seeders/demo/place");
    const streets = await listStreets();
    expect(streets.map((s) => s.name).sort()).toEqual([...new Set(LARKMOOR_STREETS.map((s) => s.name))].sort());
    const res = await (await signedInClient(app, { roles: ["resident"] })).get("/api/streets");
    expect(res.body).toEqual(streets);
  });

  it("when a street is an L of two 100 m legs, then its point is at the corner (halfway along), not the middle of its box", () => {
    // Legs of 0.000899° ≈ 100 m north, then east (111,195 m per degree of latitude [derived]).
    const dLat = 100 / METRES_PER_DEGREE_LATITUDE;
    const dLng = dLat / Math.cos((10 * Math.PI) / 180);
    const [street] = streetsFromGeoJson({
      type: "FeatureCollection",
      features: [
        {
          type: "Feature",
          properties: { kind: "street", name: "Elbow Lane" },
          geometry: {
            type: "LineString",
            coordinates: [
              [20, 10 - dLat],
              [20, 10],
              [20 + dLng, 10],
            ],
          },
        },
        {
          type: "Feature",
          properties: { kind: "park", name: "Not a street" },
          geometry: {
            type: "LineString",
            coordinates: [
              [0, 0],
              [1, 1],
            ],
          },
        },
      ],
    });
    expect(street!.name).toBe("Elbow Lane");
    expect(street!.location.lat).toBeCloseTo(10, 5);
    expect(street!.location.lng).toBeCloseTo(20, 5);
  });
});
