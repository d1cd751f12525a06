/**
 * Property test (fast-check): random bodies, params and query strings thrown at EVERY API route
 * (found by walking the router), as a visitor and as a signed-in coordinator with a valid CSRF
 * token, never get a 5xx. Whatever the input, the answer is a deliberate 2xx/4xx in the app's
 * shape, never a crash, an SQL error or an integer overflow.
 */
import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { createApp } from "../../server/app";
import { anonymousClient, signedInClient, type ApiClient } from "../helpers/db";
import { listApiRoutes, parseRoute } from "../helpers/routes";

const app = createApp({ requestLogging: false });
const routes = listApiRoutes(app);

// Keys our schemas know, so random bodies often get past the first "unknown key" check.
const knownKeys = [
  "email",
  "password",
  "name",
  "roles",
  "status",
  "personIds",
  "currentPassword",
  "newPassword",
  "newEmail",
  "householdId",
  "isVolunteer",
  "bikeLoadKg",
  "startLat",
  "startLng",
  "__proto__",
  "constructor",
];

const scalar = fc.oneof(
  fc.string({ maxLength: 40 }),
  fc.integer(),
  fc.double(),
  fc.boolean(),
  fc.constant(null),
  fc.constantFrom(
    "resident",
    "steward",
    "coordinator",
    "gardener",
    "active",
    "disabled",
    "a@example.org",
    "x".repeat(5_000),
  ),
  fc.constantFrom(2 ** 31, -(2 ** 31) - 1, Number.MAX_SAFE_INTEGER, 1e308, -0),
);
const value = fc.oneof(
  scalar,
  fc.array(scalar, { maxLength: 5 }),
  fc.dictionary(fc.string({ maxLength: 8 }), scalar, { maxKeys: 3 }),
);

const bigOrSmallInt = fc.oneof(fc.integer({ min: -3, max: 50 }), fc.constantFrom(2 ** 31, 2 ** 53, -(2 ** 31) - 1));
// Plausible values for the keys our schemas know, so many bodies pass validation and reach the database.
const plausibleValues: Record<string, fc.Arbitrary<unknown>> = {
  email: fc.oneof(fc.emailAddress(), fc.string({ maxLength: 20 })),
  password: fc.string({ minLength: 0, maxLength: 140 }),
  name: fc.string({ maxLength: 130 }),
  roles: fc.subarray(["resident", "steward", "coordinator", "gardener", "admin"]),
  status: fc.constantFrom("active", "disabled", "invited"),
  personIds: fc.array(bigOrSmallInt, { maxLength: 4 }),
  currentPassword: fc.string({ maxLength: 20 }),
  newPassword: fc.string({ minLength: 6, maxLength: 140 }),
  newEmail: fc.emailAddress(),
  householdId: fc.oneof(bigOrSmallInt, fc.constant(null)),
  isVolunteer: fc.boolean(),
  bikeLoadKg: fc.oneof(fc.double({ min: -10, max: 1e6, noNaN: true }), fc.constant(null)),
  startLat: fc.double({ min: -100, max: 100, noNaN: true }),
  startLng: fc.double({ min: -200, max: 200, noNaN: true }),
};
/** One to three of the route's accepted keys at a time: small bodies are the ones most likely to be valid. */
function plausibleBody(keys: string[]) {
  return fc
    .subarray(keys, { minLength: 1, maxLength: Math.min(3, keys.length) })
    .chain((picked) => fc.record(Object.fromEntries(picked.map((k) => [k, plausibleValues[k]!]))));
}

function bodyFor(acceptedKeys: string[]) {
  return fc.oneof(
    { arbitrary: plausibleBody(acceptedKeys), weight: 4 },
    fc.jsonValue({ maxDepth: 3 }),
    fc.dictionary(fc.constantFrom(...knownKeys), value, { maxKeys: 6 }),
    fc.dictionary(fc.string({ maxLength: 12 }), value, { maxKeys: 6 }),
    // Not JSON at all: the body parser must answer 400.
    fc.string({ maxLength: 60 }).map((raw) => ({ raw })),
  );
}

/**
 * Which of our known keys the route accepts: send them all and drop the ones its strict schema
 * names as "not an allowed field". Routes that name none (or answer otherwise) accept them all.
 */
async function acceptedKeys(client: ApiClient, route: string): Promise<string[]> {
  const all = Object.keys(plausibleValues);
  const probe = await send(client, route, ["1"], Object.fromEntries(all.map((k) => [k, null])), {});
  const fields = (probe.body?.error?.fields ?? {}) as Record<string, string>;
  const unknown = new Set(
    Object.entries(fields)
      .filter(([, message]) => message === "is not an allowed field")
      .map(([k]) => k),
  );
  const accepted = all.filter((k) => !unknown.has(k));
  return accepted.length > 0 ? accepted : all;
}

const param = fc.oneof(
  fc.integer({ min: -5, max: 5 }).map(String),
  {
    arbitrary: fc.constantFrom(
      "2147483648",
      "99999999999999999999",
      "1e3",
      "0x10",
      "-1",
      "NaN",
      "%00",
      "..",
      "A".repeat(43),
    ),
    weight: 2,
  },
  fc.string({ minLength: 1, maxLength: 50 }),
  fc.stringMatching(/^[A-Za-z0-9_-]{43}$/),
);

const query = fc.dictionary(
  fc.constantFrom("status", "from", "to", "page", "q", "limit", "digesterId"),
  fc.string({ maxLength: 20 }),
  { maxKeys: 3 },
);

async function send(
  client: ApiClient,
  route: string,
  params: string[],
  payload: unknown,
  search: Record<string, string>,
) {
  const { method, path } = parseRoute(route);
  let i = 0;
  const url = path.replace(/:[A-Za-z]+/g, () => encodeURIComponent(params[i++ % params.length] ?? "1"));
  const verb = method.toLowerCase() as "get" | "post" | "put" | "patch" | "delete";
  let req = client[verb](url).query(search);
  if (method !== "GET") {
    if (payload && typeof payload === "object" && "raw" in payload && Object.keys(payload).length === 1) {
      req = req.set("Content-Type", "application/json").send(String((payload as { raw: unknown }).raw));
    } else {
      req = req.set("Content-Type", "application/json").send(JSON.stringify(payload ?? null));
    }
  }
  return req;
}

describe("random input never breaks the API", () => {
  it("has routes to test", () => {
    expect(routes.length).toBeGreaterThan(10);
  });

  it.each(routes)("%s: no 5xx for random bodies, params and queries", { timeout: 120_000 }, async (route) => {
    // A fresh coordinator per route: logout, password and e-mail routes may change their session.
    const coordinator = await signedInClient(app, { roles: ["coordinator"] });
    const visitor = await anonymousClient(app);
    const body = bodyFor(await acceptedKeys(coordinator, route));
    const caller = fc.oneof({ arbitrary: fc.constant(coordinator), weight: 3 }, fc.constant(visitor));
    await fc.assert(
      fc.asyncProperty(
        caller,
        fc.array(param, { minLength: 1, maxLength: 3 }),
        body,
        query,
        async (client, params, payload, search) => {
          const res = await send(client, route, params, payload, search);
          if (res.status >= 500) throw new Error(`${route} answered ${res.status}: ${res.text.slice(0, 300)}`);
          // Every failure keeps the app's error shape.
          if (res.status >= 400) expect(res.body?.error?.code, `${route} ${res.status}`).toEqual(expect.any(String));
        },
      ),
      { numRuns: 30 },
    );
  });
});
