/**
 * The route × role table (QUALITY.md, Security → Access): for EVERY API route, the status that
 * anonymous, resident, steward, coordinator and gardener get for a representative request.
 * The first test walks the Express router of createApp() and fails on any route missing here
 * (or any row whose route no longer exists).
 *
 * Adding a route: add one row to `table` below, in its module's group:
 *
 * ```ts
 * row("POST /api/digesters/:id/readings", only(["steward", "coordinator"], 201), {
 *   request: (ctx) => ({ path: `/api/digesters/${ctx.ownDigesterId}/readings`, body: { temperatureC: 31 } }),
 * }),
 * ```
 *
 * - `everyone(s)`: the same status for all five; `signedIn(s)`: 401 for anonymous, `s` for the
 *   rest; `only([...roles], s)`: 401 anonymous, `s` for those roles, 403 for the others. Spread
 *   and override for object-level cases: `{ ...only(["steward"], 200), coordinator: 200 }`.
 * - `request(ctx)` returns the concrete path (fill `:params`) and body. `ctx` gives the caller
 *   (`ctx.person`), a digester the steward looks after (`ownDigesterId`) and one nobody here
 *   looks after (`otherDigesterId`), and the resident's household and another one. Without
 *   `request`, `:params` become 1 and there is no body.
 * - Each role's client has a valid CSRF token; `fresh: true` signs in a new person of that role
 *   for the row (for requests that end or replace the session).
 */
import { beforeAll, describe, expect, it } from "vitest";
import { createApp } from "../../server/app";
import {
  anonymousClient,
  createDigester,
  createHousehold,
  createPerson,
  signedInClient,
  sql,
  uniqueEmail,
  type ApiClient,
  type CreatePersonOptions,
  type TestPerson,
} from "../helpers/db";
import { listApiRoutes, parseRoute } from "../helpers/routes";
import { addDays, localDate } from "../../server/lib/clock";

const ROLES = ["anonymous", "resident", "steward", "coordinator", "gardener"] as const;
type Who = (typeof ROLES)[number];
type Expectation = Record<Who, number>;

interface AccessContext {
  who: Who;
  /** The signed-in person (undefined for anonymous). */
  person: TestPerson | undefined;
  /** A digester the table's steward looks after. */
  ownDigesterId: number;
  /** A digester nobody in the table looks after. */
  otherDigesterId: number;
  /** The table's resident's household. */
  ownHouseholdId: number;
  /** A household none of the table's people belong to. */
  otherHouseholdId: number;
}

interface Row {
  route: string;
  expect: Expectation;
  request?: (ctx: AccessContext) => Promise<{ path?: string; body?: unknown }> | { path?: string; body?: unknown };
  fresh?: boolean;
}

const everyone = (status: number): Expectation => ({
  anonymous: status,
  resident: status,
  steward: status,
  coordinator: status,
  gardener: status,
});
const signedIn = (status: number): Expectation => ({ ...everyone(status), anonymous: 401 });
const only = (roles: Exclude<Who, "anonymous">[], status: number): Expectation => ({
  anonymous: 401,
  resident: roles.includes("resident") ? status : 403,
  steward: roles.includes("steward") ? status : 403,
  coordinator: roles.includes("coordinator") ? status : 403,
  gardener: roles.includes("gardener") ? status : 403,
});
const row = (route: string, expectation: Expectation, options: Omit<Row, "route" | "expect"> = {}): Row => ({
  route,
  expect: expectation,
  ...options,
});

/** A well-formed one-time token that matches nothing. */
const unknownToken = () => "Z".repeat(20) + Math.random().toString(36).slice(2, 12).padEnd(23, "x");

/**
 * A fresh drop-off of the table's household at the table's digester: pending for today, or
 * accepted yesterday (today's ledger row is capped by the accept rows, so an accepted row written
 * straight into today would be refused by the database, as it should).
 */
async function accessDropOff(ctx: AccessContext, status: "pending" | "accepted"): Promise<number> {
  const today = localDate(new Date());
  const [d] = await sql<{ id: number }>(
    `INSERT INTO drop_offs (household_id, digester_id, for_date, weight_kg, mass_source, fresh_kg, kg_vs, status)
     VALUES ($1, $2, $3, 1, 'weighed', 1, 0.2262, $4) RETURNING id`,
    [ctx.ownHouseholdId, ctx.ownDigesterId, status === "pending" ? today : addDays(today, -1), status],
  );
  return d!.id;
}

const table: Row[] = [
  // ── foundation ──
  row("GET /api/health", everyone(200)),
  row("GET /api/public/digesters", everyone(200)),
  row("GET /api/digesters", signedIn(200)),

  // ── auth (issue 3) ──
  row("GET /api/auth/csrf", everyone(200)),
  // A wrong password for an unknown address: 401 for everyone (a unique address, so no throttling).
  row("POST /api/auth/login", everyone(401), {
    request: () => ({ body: { email: uniqueEmail("access"), password: "not-the-password" } }),
  }),
  row("GET /api/auth/me", signedIn(200)),
  row("POST /api/auth/logout", everyone(204), { fresh: true }),
  row("GET /api/auth/session", signedIn(200)),
  row("POST /api/auth/session", signedIn(200), { request: () => ({ body: {} }) }),
  row("POST /api/auth/password-reset", everyone(202), {
    request: () => ({ body: { email: uniqueEmail("access-reset") } }),
  }),
  row("GET /api/auth/password-reset/:token", everyone(404), {
    request: () => ({ path: `/api/auth/password-reset/${unknownToken()}` }),
  }),
  row("POST /api/auth/password-reset/:token", everyone(404), {
    request: () => ({
      path: `/api/auth/password-reset/${unknownToken()}`,
      body: { password: "a long new passphrase" },
    }),
  }),

  // ── people (issue 3) ──
  row("GET /api/people", only(["coordinator"], 200)),
  row("POST /api/people/invitations", only(["coordinator"], 201), {
    request: () => ({ body: { email: uniqueEmail("access-invite"), roles: ["resident"] } }),
  }),
  row("PATCH /api/people/:id", only(["coordinator"], 200), {
    request: async () => ({
      path: `/api/people/${(await createPerson()).id}`,
      body: { name: "Renamed by access test" },
    }),
  }),
  row("PUT /api/digesters/:id/stewards", only(["coordinator"], 200), {
    request: async () => ({ path: `/api/digesters/${(await createDigester()).id}/stewards`, body: { personIds: [] } }),
  }),
  row("GET /api/invitations/:token", everyone(404), {
    request: () => ({ path: `/api/invitations/${unknownToken()}` }),
  }),
  row("POST /api/invitations/:token/accept", everyone(404), {
    request: () => ({
      path: `/api/invitations/${unknownToken()}/accept`,
      body: { name: "Someone", password: "a long new passphrase" },
    }),
  }),
  row("GET /api/outbox-emails", only(["coordinator"], 200)),

  // ── account (issue 3) ──
  row("PATCH /api/account", signedIn(200), { request: () => ({ body: { name: "Renamed by access test" } }) }),
  // A wrong current password: 400 for the signed-in, so the row changes nothing.
  row("POST /api/account/password", signedIn(400), {
    request: () => ({ body: { currentPassword: "not-the-password", newPassword: "a long new passphrase" } }),
  }),
  row("POST /api/account/email", signedIn(400), {
    request: () => ({ body: { password: "not-the-password", newEmail: uniqueEmail("access-email") } }),
  }),

  // ── households and drop-offs, resident side (issue 5) ──
  row("GET /api/streets", everyone(200)),
  // Coordinators get every household, everyone else only their own (or an empty list).
  row("GET /api/households", signedIn(200)),
  // A fresh resident is first taken out of the table's household, so they can register one.
  row("POST /api/households", only(["resident"], 201), {
    fresh: true,
    request: async (ctx) => {
      if (ctx.who === "resident")
        await sql(`UPDATE people SET household_id = NULL WHERE id = $1 RETURNING id`, [ctx.person!.id]);
      return { body: { name: "Access-table household", location: { lat: 51.5, lng: -0.1 } } };
    },
  }),
  row("GET /api/households/mine", signedIn(200)),
  row("PATCH /api/households/mine", only(["resident"], 200), {
    request: () => ({ body: { addressText: "1 Access Row" } }),
  }),
  row("POST /api/households/mine/members", only(["resident"], 201), {
    request: () => ({ body: { email: uniqueEmail("access-member") } }),
  }),
  row("GET /api/households/mine/impact", signedIn(200)),
  row("POST /api/drop-offs", only(["resident"], 201), {
    request: (ctx) => ({
      body: { digesterId: ctx.ownDigesterId, bucketCount: 1, bucketLitres: 10, noRefuseConfirmed: true },
    }),
  }),
  row("GET /api/drop-offs", signedIn(200), { request: () => ({ path: "/api/drop-offs?mine=true" }) }),
  // The resident cancels a pending drop-off of their own household; the other roles are refused by role.
  row("POST /api/drop-offs/:id/cancel", only(["resident"], 200), {
    request: async (ctx) => {
      const [d] = await sql<{ id: number }>(
        `INSERT INTO drop_offs (household_id, digester_id, for_date, weight_kg, mass_source, fresh_kg, kg_vs)
         VALUES ($1, $2, current_date, 2, 'weighed', 2, 0.4524) RETURNING id`,
        [ctx.ownHouseholdId, ctx.ownDigesterId],
      );
      return { path: `/api/drop-offs/${d!.id}/cancel` };
    },
  }),

  // ── the steward's day, readings and the digester page (issue 5, steward side) ──
  // Stewards act on the digesters they look after (ownDigesterId), coordinators on all; the table's
  // digester has no temperature, so budget-spending rows carry an override with a reason.
  row("GET /api/steward/today", only(["steward", "coordinator"], 200)),
  row("POST /api/drop-offs/:id/accept", only(["steward", "coordinator"], 200), {
    request: async (ctx) => ({
      path: `/api/drop-offs/${await accessDropOff(ctx, "pending")}/accept`,
      body: { override: { reason: "access table" } },
    }),
  }),
  row("POST /api/drop-offs/:id/feed", only(["steward", "coordinator"], 200), {
    request: async (ctx) => ({
      path: `/api/drop-offs/${await accessDropOff(ctx, "accepted")}/feed`,
      body: { override: { reason: "access table" } },
    }),
  }),
  row("POST /api/drop-offs/:id/turn-away", only(["steward", "coordinator"], 200), {
    request: async (ctx) => ({
      path: `/api/drop-offs/${await accessDropOff(ctx, "pending")}/turn-away`,
      body: { reason: "contamination" },
    }),
  }),
  row("POST /api/digesters/:id/feedings", only(["steward", "coordinator"], 201), {
    request: (ctx) => ({
      path: `/api/digesters/${ctx.ownDigesterId}/feedings`,
      body: { freshKg: 1, override: { reason: "access table" } },
    }),
  }),
  row("GET /api/digesters/:id/feedings", only(["steward", "coordinator"], 200), {
    request: (ctx) => ({ path: `/api/digesters/${ctx.ownDigesterId}/feedings` }),
  }),
  row("GET /api/digesters/:id/feedings.csv", only(["steward", "coordinator"], 200), {
    request: (ctx) => ({ path: `/api/digesters/${ctx.ownDigesterId}/feedings.csv` }),
  }),
  row("POST /api/digesters/:id/readings", only(["steward", "coordinator"], 201), {
    request: (ctx) => ({
      path: `/api/digesters/${ctx.ownDigesterId}/readings`,
      body: { takenAt: new Date().toISOString(), temperatureC: 31 },
    }),
  }),
  // Readings are the digester's working record: its stewards and coordinators read them, residents and gardeners do not.
  row("GET /api/digesters/:id/readings", only(["steward", "coordinator"], 200), {
    request: (ctx) => ({ path: `/api/digesters/${ctx.ownDigesterId}/readings` }),
  }),
  row("GET /api/digesters/:id/readings.csv", only(["steward", "coordinator"], 200), {
    request: (ctx) => ({ path: `/api/digesters/${ctx.ownDigesterId}/readings.csv` }),
  }),
  // Uploads are for the digester's own stewards only (QUALITY.md: steward-only). This table cannot attach a
  // file, so the steward's request reaches the handler and gets 400 "attach a file" (tests/server/readings-import.test.ts uploads).
  row(
    "POST /api/digesters/:id/readings/import",
    { ...only(["steward"], 400) },
    {
      request: (ctx) => ({ path: `/api/digesters/${ctx.ownDigesterId}/readings/import` }),
    },
  ),
  row("GET /api/digesters/:id", only(["steward", "coordinator"], 200), {
    request: (ctx) => ({ path: `/api/digesters/${ctx.ownDigesterId}` }),
  }),
  row("PATCH /api/digesters/:id", only(["steward", "coordinator"], 200), {
    request: (ctx) => ({
      path: `/api/digesters/${ctx.ownDigesterId}`,
      body: { siteDescription: "Behind the access-table shed" },
    }),
  }),
  row("PUT /api/digesters/:id/status", only(["steward", "coordinator"], 200), {
    request: (ctx) => ({ path: `/api/digesters/${ctx.ownDigesterId}/status`, body: { status: "active" } }),
  }),
  row("GET /api/digesters/:id/history", only(["steward", "coordinator"], 200), {
    request: (ctx) => ({ path: `/api/digesters/${ctx.ownDigesterId}/history?days=14` }),
  }),

  // ── coordinator's board (issue 6) ──
  row("POST /api/assignments/proposals", only(["coordinator"], 200), {
    request: () => ({ body: { excludeDigesterIds: [] } }),
  }),
  // A version that matches no assignment: the coordinator reaches the check and is told it is stale.
  row("POST /api/assignments/apply", only(["coordinator"], 409), {
    request: () => ({ body: { version: "stale", changes: [] } }),
  }),
  row("PUT /api/households/:id/pin", only(["coordinator"], 200), {
    request: (ctx) => ({ path: `/api/households/${ctx.otherHouseholdId}/pin`, body: { pinned: false } }),
  }),
  row("GET /api/rebalancing", only(["coordinator"], 200)),
  // Drop-off 999999999 does not exist: the coordinator reaches the service and gets 404.
  row("POST /api/rebalancing/moves", only(["coordinator"], 404), {
    request: (ctx) => ({ body: { moves: [{ dropOffId: 999999999, digesterId: ctx.otherDigesterId }] } }),
  }),
  // Collections: a day with no request from anyone here; the table's resident has a household, the steward none (409).
  row(
    "POST /api/collection-requests",
    { ...only(["resident"], 201) },
    {
      request: () => ({
        body: { forDate: addDays(localDate(new Date()), 30 + Math.floor(Math.random() * 29)), bucketCount: 1 },
      }),
    },
  ),
  row("GET /api/collection-requests", signedIn(200), {
    request: () => ({ path: "/api/collection-requests?mine=true" }),
  }),
  // Request 999999999 does not exist: residents and coordinators reach the service (404).
  row(
    "POST /api/collection-requests/:id/cancel",
    { ...only(["resident", "coordinator"], 404) },
    {
      request: () => ({ path: "/api/collection-requests/999999999/cancel", body: {} }),
    },
  ),
  row("POST /api/collection-rounds/plan", only(["coordinator"], 200), {
    request: () => ({ body: { forDate: addDays(localDate(new Date()), 59) } }),
  }),
  row("GET /api/collection-rounds", signedIn(200)),
  // Round 999999999 does not exist: anyone signed in reaches the service (404), whose guard follows the lookup.
  row("GET /api/collection-rounds/:id", signedIn(404), {
    request: () => ({ path: "/api/collection-rounds/999999999" }),
  }),
  row("GET /api/collection-rounds/:id/geojson", signedIn(404), {
    request: () => ({ path: "/api/collection-rounds/999999999/geojson" }),
  }),
  row("POST /api/collection-rounds/:id/stops/:requestId/collected", signedIn(404), {
    request: () => ({ path: "/api/collection-rounds/999999999/stops/1/collected", body: {} }),
  }),

  // ── public calculators (stateless; an empty body is a 400 for anyone) ──
  ...[
    "feed-budget",
    "fertiliser-allowance",
    "gas-holder",
    "methane-yield",
    "sizing",
    "titration",
    "weights-for-pressure",
  ].map((name) => row(`POST /api/calc/${name}`, everyone(400), { request: () => ({ body: {} }) })),
];

const app = createApp({ requestLogging: false });

const personOptions: Record<
  Exclude<Who, "anonymous">,
  (ctx: { ownDigesterId: number; ownHouseholdId: number }) => CreatePersonOptions
> = {
  resident: (c) => ({ roles: ["resident"], householdId: c.ownHouseholdId }),
  steward: (c) => ({ roles: ["steward"], stewardOf: [c.ownDigesterId] }),
  coordinator: () => ({ roles: ["coordinator"] }),
  gardener: () => ({ roles: ["gardener"] }),
};

let world: { ownDigesterId: number; otherDigesterId: number; ownHouseholdId: number; otherHouseholdId: number };
const clients = new Map<Who, ApiClient>();

async function clientOf(who: Who): Promise<ApiClient> {
  if (who === "anonymous") return anonymousClient(app);
  return signedInClient(app, personOptions[who](world));
}

beforeAll(async () => {
  const own = await createDigester();
  const other = await createDigester();
  const home = await createHousehold({ assignedDigesterId: own.id });
  const away = await createHousehold({ assignedDigesterId: other.id });
  world = { ownDigesterId: own.id, otherDigesterId: other.id, ownHouseholdId: home.id, otherHouseholdId: away.id };
  for (const who of ROLES) clients.set(who, await clientOf(who));
});

describe("route × role access table", () => {
  it("when the router is walked, then every API route has a row and every row a route", () => {
    const routes = listApiRoutes(app);
    const declared = table.map((r) => r.route);
    expect(
      routes.filter((r) => !declared.includes(r)),
      "routes missing from the access table",
    ).toEqual([]);
    expect(
      declared.filter((r) => !routes.includes(r)),
      "rows for routes that do not exist",
    ).toEqual([]);
    expect(new Set(declared).size, "each route declared once").toBe(declared.length);
  });

  it.each(table.map((r) => [r.route, r] as const))("%s", async (_name, entry) => {
    const { method, path } = parseRoute(entry.route);
    const got: Partial<Expectation> = {};
    for (const who of ROLES) {
      const client = entry.fresh ? await clientOf(who) : clients.get(who)!;
      const ctx: AccessContext = { who, person: client.person, ...world };
      const built = (await entry.request?.(ctx)) ?? {};
      const url = built.path ?? path.replace(/:[A-Za-z]+/g, "1");
      const verb = method.toLowerCase() as "get" | "post" | "put" | "patch" | "delete";
      let req = client[verb](url);
      if (built.body !== undefined) req = req.send(built.body as object);
      const res = await req;
      got[who] = res.status;
    }
    expect(got).toEqual(entry.expect);
  });
});

describe("CSRF on every state-changing route", () => {
  it("when a signed-in coordinator sends any POST, PUT, PATCH or DELETE without the token, then it is 403 (public calculators aside)", async () => {
    const coordinator = clients.get("coordinator")!;
    const results: Record<string, number> = {};
    for (const route of listApiRoutes(app)) {
      const { method, path } = parseRoute(route);
      if (method === "GET" || path.startsWith("/api/calc/")) continue;
      const verb = method.toLowerCase() as "post" | "put" | "patch" | "delete";
      const res = await coordinator.agent[verb](path.replace(/:[A-Za-z]+/g, "1")).send({});
      results[route] = res.status;
    }
    expect(Object.values(results).length).toBeGreaterThan(5);
    for (const [route, status] of Object.entries(results)) expect({ route, status }).toEqual({ route, status: 403 });
  });
});
