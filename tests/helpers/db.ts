/**
 * API-test helpers: fresh rows for each test, and signed-in supertest clients that carry the
 * session cookie and the CSRF token for you. Every helper writes new rows with unique names, so
 * tests never depend on each other or on the demo data.
 *
 * Typical use:
 *
 * ```ts
 * const app = createApp({ requestLogging: false });
 * const digester = await createDigester();
 * const steward = await signedInClient(app, { roles: ["steward"], stewardOf: [digester.id] });
 * const res = await steward.post(`/api/digesters/${digester.id}/readings`).send({ … });
 * expect(res.status).toBe(201);
 * expect(await sql("SELECT * FROM readings WHERE digester_id = $1", [digester.id])).toHaveLength(1);
 *
 * const visitor = await anonymousClient(app); // has a CSRF token, no sign-in
 * ```
 */
import type { Express } from "express";
import request from "supertest";
import { QueryTypes } from "sequelize";
import { sequelize } from "../../server/db/sequelize";
import { hashPassword } from "../../server/lib/password";
import type { Role, SessionUser } from "../../shared/schemas/auth";

/** The password createPerson() gives when none is asked for (not on the common-password list). */
export const TEST_PASSWORD = "lantern-orchard-4471";

let sequence = 0;
/** A unique, undeliverable-looking address under example.org (RFC 2606), e.g. "steward-lx3k9-7@example.org". */
export function uniqueEmail(label = "person"): string {
  sequence += 1;
  return `${label}-${Date.now().toString(36)}${Math.random().toString(36).slice(2, 6)}-${sequence}@example.org`;
}

/** Runs SQL with `$1`-style parameters and returns the rows (for arranging and asserting). */
export async function sql<T extends object = Record<string, unknown>>(
  query: string,
  bind: unknown[] = [],
): Promise<T[]> {
  return sequelize().query<T>(query, { bind, type: QueryTypes.SELECT });
}

// argon2 takes tens of milliseconds; tests reuse one hash per password.
const hashes = new Map<string, Promise<string>>();
function hashed(password: string) {
  let h = hashes.get(password);
  if (!h) {
    h = hashPassword(password);
    hashes.set(password, h);
  }
  return h;
}

export interface CreatePersonOptions {
  roles?: Role[];
  email?: string;
  name?: string;
  /** Defaults to TEST_PASSWORD; null leaves no password (as for an invited person). */
  password?: string | null;
  status?: "active" | "invited" | "disabled";
  householdId?: number | null;
  /** Digester ids this person stewards (rows in digester_stewards). */
  stewardOf?: number[];
  isVolunteer?: boolean;
  bikeLoadKg?: number | null;
}

export interface TestPerson {
  id: number;
  email: string;
  name: string;
  roles: Role[];
  /** The plain password, to sign in with (null when none was set). */
  password: string | null;
  householdId: number | null;
  stewardOf: number[];
}

/** Inserts a person (active with TEST_PASSWORD unless told otherwise). */
export async function createPerson(options: CreatePersonOptions = {}): Promise<TestPerson> {
  const roles = options.roles ?? ["resident"];
  const email = options.email ?? uniqueEmail(roles[0] ?? "person");
  const name = options.name ?? `Test ${roles.join(" ") || "person"} ${sequence}`;
  const password = options.password === undefined ? TEST_PASSWORD : options.password;
  const status = options.status ?? (password === null ? "invited" : "active");
  const [row] = await sql<{ id: number }>(
    `INSERT INTO people (email, name, password_hash, status, roles, household_id, is_volunteer, bike_load_kg, password_changed_at)
     VALUES ($1, $2, $3, $4, $5, $6, $7, $8, now()) RETURNING id`,
    [
      email,
      name,
      password === null ? null : await hashed(password),
      status,
      roles,
      options.householdId ?? null,
      options.isVolunteer ?? false,
      options.bikeLoadKg ?? null,
    ],
  );
  const id = row!.id;
  for (const digesterId of options.stewardOf ?? []) {
    await sql(`INSERT INTO digester_stewards (digester_id, person_id) VALUES ($1, $2) RETURNING person_id`, [
      digesterId,
      id,
    ]);
  }
  return {
    id,
    email,
    name,
    roles,
    password,
    householdId: options.householdId ?? null,
    stewardOf: options.stewardOf ?? [],
  };
}

export interface CreateDigesterOptions {
  name?: string;
  lat?: number;
  lng?: number;
  workingVolumeM3?: number;
  status?: "active" | "resting" | "offline";
  startedOn?: string;
}

/** Inserts a digester with plausible defaults (1 m³, active, started 2026-01-05). */
export async function createDigester(options: CreateDigesterOptions = {}): Promise<{ id: number; name: string }> {
  sequence += 1;
  const name = options.name ?? `Test digester ${sequence}`;
  const status = options.status ?? "active";
  const [row] = await sql<{ id: number }>(
    `INSERT INTO digesters (name, lat, lng, working_volume_m3, status, status_reason, started_on)
     VALUES ($1, $2, $3, $4, $5, $6, $7) RETURNING id`,
    [
      name,
      options.lat ?? 51.5,
      options.lng ?? -0.1,
      options.workingVolumeM3 ?? 1,
      status,
      status === "active" ? null : "test",
      options.startedOn ?? "2026-01-05",
    ],
  );
  return { id: row!.id, name };
}

/** Inserts a household (optionally assigned to a digester). */
export async function createHousehold(
  options: { name?: string; assignedDigesterId?: number | null; lat?: number; lng?: number } = {},
) {
  sequence += 1;
  const name = options.name ?? `Test household ${sequence}`;
  const [row] = await sql<{ id: number }>(
    `INSERT INTO households (name, lat, lng, assigned_digester_id) VALUES ($1, $2, $3, $4) RETURNING id`,
    [name, options.lat ?? 51.5, options.lng ?? -0.1, options.assignedDigesterId ?? null],
  );
  return { id: row!.id, name };
}

export type Agent = ReturnType<typeof request.agent>;

/** Fetches (creating if needed) the CSRF token of the agent's session. */
export async function csrfToken(agent: Agent): Promise<string> {
  const res = await agent.get("/api/auth/csrf");
  if (res.status !== 200) throw new Error(`GET /api/auth/csrf answered ${res.status}`);
  return res.body.token as string;
}

/**
 * Signs the agent in through the real API (CSRF token, POST /api/auth/login) and returns the
 * new session's CSRF token (sign-in starts a new session, so the old token is void).
 * Throws when sign-in does not answer 200.
 */
export async function signIn(
  agent: Agent,
  email: string,
  password: string,
): Promise<{ csrf: string; user: SessionUser }> {
  const before = await csrfToken(agent);
  const res = await agent.post("/api/auth/login").set("x-csrf-token", before).send({ email, password });
  if (res.status !== 200) throw new Error(`sign-in as ${email} answered ${res.status}: ${JSON.stringify(res.body)}`);
  return { csrf: await csrfToken(agent), user: res.body as SessionUser };
}

/** A supertest agent with its session cookie, sending the CSRF token on every request. */
export interface ApiClient {
  agent: Agent;
  /** The person signed in (undefined for an anonymous client). */
  person: TestPerson | undefined;
  csrf: string;
  get(path: string): request.Test;
  post(path: string): request.Test;
  put(path: string): request.Test;
  patch(path: string): request.Test;
  delete(path: string): request.Test;
  /** Fetches the token again (after something replaced the session). */
  refreshCsrf(): Promise<string>;
}

function wrap(agent: Agent, csrf: string, person: TestPerson | undefined): ApiClient {
  const client: ApiClient = {
    agent,
    person,
    csrf,
    get: (path) => agent.get(path),
    post: (path) => agent.post(path).set("x-csrf-token", client.csrf),
    put: (path) => agent.put(path).set("x-csrf-token", client.csrf),
    patch: (path) => agent.patch(path).set("x-csrf-token", client.csrf),
    delete: (path) => agent.delete(path).set("x-csrf-token", client.csrf),
    refreshCsrf: async () => {
      client.csrf = await csrfToken(agent);
      return client.csrf;
    },
  };
  return client;
}

/** A visitor: a session with a CSRF token, nobody signed in. */
export async function anonymousClient(app: Express): Promise<ApiClient> {
  const agent = request.agent(app);
  return wrap(agent, await csrfToken(agent), undefined);
}

/** Signs in an existing test person. */
export async function clientFor(app: Express, person: TestPerson): Promise<ApiClient> {
  if (!person.password) throw new Error("This person has no password to sign in with.");
  const agent = request.agent(app);
  const { csrf } = await signIn(agent, person.email, person.password);
  return wrap(agent, csrf, person);
}

/** Creates a fresh person with these options and returns a client signed in as them. */
export async function signedInClient(
  app: Express,
  options: CreatePersonOptions = {},
): Promise<ApiClient & { person: TestPerson }> {
  const person = await createPerson(options);
  return (await clientFor(app, person)) as ApiClient & { person: TestPerson };
}

/** The session id inside a `hearthloop.sid` cookie value (`s:<sid>.<signature>`), for checking the sessions table. */
export function sessionIdFromCookies(setCookie: string[] | string | undefined): string | undefined {
  const list = Array.isArray(setCookie) ? setCookie : setCookie ? [setCookie] : [];
  for (const cookie of list) {
    const match = /hearthloop\.sid=([^;]+)/.exec(cookie);
    if (match)
      return decodeURIComponent(match[1]!)
        .replace(/^s:/, "")
        .replace(/\.[^.]+$/, "");
  }
  return undefined;
}
