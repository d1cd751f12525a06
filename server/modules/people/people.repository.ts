/**
 * `people`, `invitations` and `sessions`, owned by the people module: accounts and their roles,
 * invitations, passwords, and the sign-in sessions that end with them. Other modules (auth,
 * account, households, assignments, rounds, rebalancing) call the people module's index.ts.
 */
import { Op, QueryTypes, type Transaction, fn, literal } from "sequelize";
import { badRequest } from "../../lib/app-error";
import type { Caller } from "../../lib/caller";
import { models } from "../../db/models";
import { sequelize } from "../../db/sequelize";
import type { Role } from "../../../shared/schemas/auth";
import type { PersonRow, PersonStatus } from "../../../shared/schemas/people";

interface PersonRowDb {
  id: number;
  name: string;
  email: string;
  roles: Role[];
  status: PersonStatus;
  household_id: number | null;
  household_name: string | null;
  steward_of: number[] | null;
  is_volunteer: boolean;
  bike_load_kg: number | null;
  created_at: Date;
  invitation_expires_at: Date | null;
}

const personRowSelect = `
  SELECT p.id, p.name, p.email, p.roles, p.status, p.household_id, h.name AS household_name,
         (SELECT array_agg(ds.digester_id ORDER BY ds.digester_id) FROM digester_stewards ds WHERE ds.person_id = p.id) AS steward_of,
         p.is_volunteer, p.bike_load_kg, p.created_at,
         (SELECT max(i.expires_at) FROM invitations i WHERE i.person_id = p.id AND i.used_at IS NULL AND p.status = 'invited') AS invitation_expires_at
    FROM people p LEFT JOIN households h ON h.id = p.household_id`;

function toPersonRow(r: PersonRowDb): PersonRow {
  return {
    id: r.id,
    name: r.name,
    email: r.email,
    roles: r.roles,
    status: r.status,
    householdId: r.household_id,
    householdName: r.household_name,
    stewardOf: r.steward_of ?? [],
    isVolunteer: r.is_volunteer,
    bikeLoadKg: r.bike_load_kg === null ? null : Number(r.bike_load_kg),
    createdAt: new Date(r.created_at).toISOString(),
    invitationExpiresAt: r.invitation_expires_at ? new Date(r.invitation_expires_at).toISOString() : null,
  };
}

/** Everyone, for the coordinators' table (one statement). */
export async function listPeople(): Promise<PersonRow[]> {
  // SQL: each person with their steward duties and open invitation (aggregate subqueries), one statement.
  const rows = await sequelize().query<PersonRowDb>(`${personRowSelect} ORDER BY p.name, p.id`, {
    type: QueryTypes.SELECT,
  });
  return rows.map(toPersonRow);
}

export async function getPersonRow(id: number, transaction?: Transaction): Promise<PersonRow | null> {
  // SQL: the same aggregate subqueries as listPeople.
  const rows = await sequelize().query<PersonRowDb>(`${personRowSelect} WHERE p.id = $1`, {
    bind: [id],
    type: QueryTypes.SELECT,
    transaction,
  });
  return rows[0] ? toPersonRow(rows[0]) : null;
}

export interface LockedPerson {
  id: number;
  email: string;
  name: string;
  status: PersonStatus;
  roles: Role[];
  hasPassword: boolean;
  householdId: number | null;
}

/** Locks the person row for the transaction (by id or e-mail). */
export async function lockPerson(
  transaction: Transaction,
  by: { id: number } | { email: string },
): Promise<LockedPerson | null> {
  // SQL: a row lock, by id or by the case-insensitive e-mail.
  const [where, value] = "id" in by ? ["id = $1", by.id] : ["email = $1", by.email];
  const rows = await sequelize().query<{
    id: number;
    email: string;
    name: string;
    status: PersonStatus;
    roles: Role[];
    has_password: boolean;
    household_id: number | null;
  }>(
    `SELECT id, email, name, status, roles, password_hash IS NOT NULL AS has_password, household_id FROM people WHERE ${where} FOR UPDATE`,
    { bind: [value], type: QueryTypes.SELECT, transaction },
  );
  const r = rows[0];
  return r
    ? {
        id: r.id,
        email: r.email,
        name: r.name,
        status: r.status,
        roles: r.roles,
        hasPassword: r.has_password,
        householdId: r.household_id,
      }
    : null;
}

/**
 * Runs a write of `people`; a household id that names no household (people.household_id's
 * foreign key; households are another module's) becomes a 400 on the field (the caller's
 * transaction then rolls back).
 */
async function checkingHousehold<T>(write: () => Promise<T>): Promise<T> {
  try {
    return await write();
  } catch (err) {
    const pg = (err as { parent?: { code?: string; constraint?: string } }).parent;
    if (pg?.code === "23503" && pg.constraint === "people_household_id_fkey") {
      throw badRequest("Please check the household.", { householdId: "There is no household with this id." });
    }
    throw err;
  }
}

/**
 * Invitations of one address (in any letter case) take turns until the transaction ends, so
 * two at once cannot both find "nobody yet" and race to insert the same person. Advisory, not
 * a row lock: before the first invitation there is no row to lock.
 */
export async function lockInvitationAddress(transaction: Transaction, email: string): Promise<void> {
  await sequelize().query(`SELECT pg_advisory_xact_lock(hashtext('hearthloop.invitation:' || lower($1)))`, {
    bind: [email],
    transaction,
  });
}

/** The person's open invitation if it was written less than `seconds` ago (database clock), else null. */
export async function recentOpenInvitation(
  transaction: Transaction,
  personId: number,
  seconds: number,
): Promise<{ name: string; roles: Role[] } | null> {
  const rows = await sequelize().query<{ name: string; roles: Role[] }>(
    `SELECT name, roles FROM invitations
      WHERE person_id = $1 AND used_at IS NULL AND expires_at > now() AND created_at > now() - make_interval(secs => $2)
      ORDER BY created_at DESC LIMIT 1`,
    { bind: [personId, seconds], type: QueryTypes.SELECT, transaction },
  );
  return rows[0] ?? null;
}

export async function insertInvitedPerson(
  transaction: Transaction,
  input: { email: string; name: string; roles: Role[]; householdId: number | null },
): Promise<number> {
  const row = await checkingHousehold(() =>
    models().Person.create(
      {
        ...input,
        status: "invited",
        passwordHash: null,
        bikeLoadKg: null,
        startLat: null,
        startLng: null,
        passwordChangedAt: null,
      },
      { transaction },
    ),
  );
  return row.id;
}

/** Column names of `people` a coordinator may set, by their API names. */
const updatable = {
  name: "name",
  roles: "roles",
  status: "status",
  householdId: "household_id",
  isVolunteer: "is_volunteer",
  bikeLoadKg: "bike_load_kg",
  startLat: "start_lat",
  startLng: "start_lng",
} as const;

export type PersonChanges = Partial<Record<keyof typeof updatable, unknown>>;

export async function updatePerson(transaction: Transaction, id: number, changes: PersonChanges): Promise<void> {
  const present = Object.fromEntries(
    Object.keys(updatable)
      .filter((key) => changes[key as keyof typeof updatable] !== undefined)
      .map((key) => [key, changes[key as keyof typeof updatable]]),
  );
  if (Object.keys(present).length === 0) return;
  await checkingHousehold(() => models().Person.update(present, { where: { id }, transaction }));
}

/** Revokes a person's open invitations (a new one replaces them). */
export async function revokeInvitations(transaction: Transaction, personId: number): Promise<void> {
  await models().Invitation.update(
    { expiresAt: literal("least(expires_at, now())") as unknown as Date },
    { where: { personId, usedAt: null }, transaction },
  );
}

export async function insertInvitation(
  transaction: Transaction,
  input: {
    tokenHash: string;
    email: string;
    name: string;
    roles: Role[];
    invitedBy: number;
    expiresAt: Date;
    personId: number;
  },
): Promise<void> {
  await models().Invitation.create(input, { transaction });
}

export interface InvitationRow {
  id: number;
  email: string;
  name: string;
  roles: Role[];
  expiresAt: Date;
  usedAt: Date | null;
  personId: number | null;
  personStatus: PersonStatus | null;
}

/** The invitation behind a token hash; with `transaction`, locked so it is used once. */
export async function findInvitation(tokenHash: string, transaction?: Transaction): Promise<InvitationRow | null> {
  // SQL: a row lock on the invitation only (FOR UPDATE OF i) inside a transaction, with its person's status.
  const rows = await sequelize().query<{
    id: number;
    email: string;
    name: string;
    roles: Role[];
    expires_at: Date;
    used_at: Date | null;
    person_id: number | null;
    status: PersonStatus | null;
  }>(
    `SELECT i.id, i.email, i.name, i.roles, i.expires_at, i.used_at, i.person_id, p.status
       FROM invitations i LEFT JOIN people p ON p.id = i.person_id
      WHERE i.token_hash = $1 ${transaction ? "FOR UPDATE OF i" : ""}`,
    { bind: [tokenHash], type: QueryTypes.SELECT, transaction },
  );
  const r = rows[0];
  return r
    ? {
        id: r.id,
        email: r.email,
        name: r.name,
        roles: r.roles,
        expiresAt: new Date(r.expires_at),
        usedAt: r.used_at,
        personId: r.person_id,
        personStatus: r.status,
      }
    : null;
}

export async function activateInvitedPerson(
  transaction: Transaction,
  personId: number,
  name: string,
  passwordHash: string,
): Promise<void> {
  await models().Person.update(
    { name, passwordHash, status: "active", passwordChangedAt: fn("now") as unknown as Date },
    { where: { id: personId, status: "invited" }, transaction },
  );
}

export async function markInvitationUsed(transaction: Transaction, invitationId: number): Promise<void> {
  await models().Invitation.update(
    { usedAt: fn("now") as unknown as Date },
    { where: { id: invitationId }, transaction },
  );
}

export async function findPeopleByIds(
  transaction: Transaction,
  ids: number[],
): Promise<{ id: number; name: string; roles: Role[]; status: PersonStatus }[]> {
  if (ids.length === 0) return [];
  const rows = await models().Person.findAll({
    attributes: ["id", "name", "roles", "status"],
    where: { id: ids },
    transaction,
  });
  return rows.map((p) => ({ id: p.id, name: p.name, roles: p.roles, status: p.status }));
}

// ---- Sign-in: the caller behind an e-mail or a session, passwords and sessions ----

interface CallerRow {
  id: number;
  email: string;
  name: string;
  roles: Role[];
  household_id: number | null;
  steward_of: number[] | null;
  status: "invited" | "active" | "disabled";
  password_hash: string | null;
}

const callerColumns = `
  p.id, p.email, p.name, p.roles, p.household_id, p.status, p.password_hash,
  (SELECT array_agg(ds.digester_id ORDER BY ds.digester_id) FROM digester_stewards ds WHERE ds.person_id = p.id) AS steward_of`;

function toCaller(row: CallerRow): Caller {
  return {
    id: row.id,
    email: row.email,
    name: row.name,
    roles: row.roles,
    stewardOf: row.steward_of ?? [],
    householdId: row.household_id,
  };
}

export interface SignInRecord {
  caller: Caller;
  status: CallerRow["status"];
  passwordHash: string | null;
}

async function findOne(where: string, bind: unknown[], transaction?: Transaction): Promise<SignInRecord | null> {
  // SQL kept for a hot read (every signed-in request reloads its caller): one statement with the
  // steward duties as an aggregate subquery.
  const rows = await sequelize().query<CallerRow>(`SELECT ${callerColumns} FROM people p WHERE ${where}`, {
    bind,
    type: QueryTypes.SELECT,
    transaction,
  });
  const row = rows[0];
  return row ? { caller: toCaller(row), status: row.status, passwordHash: row.password_hash } : null;
}

/** The account behind an e-mail (case-insensitive), with its hash, for checking a password. */
export function findByEmail(email: string, transaction?: Transaction) {
  return findOne("p.email = $1", [email], transaction);
}

export function findById(id: number, transaction?: Transaction) {
  return findOne("p.id = $1", [id], transaction);
}

/** The signed-in person for a session, or null when the account is gone or not active. */
export async function findActiveCaller(id: number): Promise<Caller | null> {
  const record = await findOne("p.id = $1 AND p.status = 'active'", [id]);
  return record?.caller ?? null;
}

export async function setPassword(transaction: Transaction, personId: number, passwordHash: string): Promise<void> {
  await models().Person.update(
    { passwordHash, passwordChangedAt: fn("now") as unknown as Date },
    { where: { id: personId }, transaction },
  );
}

/**
 * Ends every session of a person at once (all but `exceptSessionId` when given), by deleting the
 * rows: the next request with such a cookie finds no session and is anonymous.
 */
export async function deleteSessionsOf(
  personId: number,
  exceptSessionId?: string,
  transaction?: Transaction,
): Promise<number> {
  // SQL: a delete by an expression into connect-pg-simple's JSON (matched by sessions_person_idx).
  const rows = await sequelize().query(
    `DELETE FROM sessions WHERE (sess -> 'passport' ->> 'user') = $1 AND sid <> $2 RETURNING sid`,
    { bind: [String(personId), exceptSessionId ?? ""], type: QueryTypes.SELECT, transaction },
  );
  return rows.length;
}

// ---- What other modules read and write about people ----

/** Active residents of these households, for the e-mails. */
export async function residentsOf(
  householdIds: number[],
  transaction?: Transaction,
): Promise<{ householdId: number; email: string; name: string }[]> {
  if (householdIds.length === 0) return [];
  const rows = await models().Person.findAll({
    attributes: ["householdId", "email", "name"],
    where: { householdId: householdIds, status: "active" },
    order: [["id", "ASC"]],
    transaction,
  });
  return rows.map((p) => ({ householdId: p.householdId!, email: p.email, name: p.name }));
}

export interface Volunteer {
  id: number;
  name: string;
  lat: number;
  lng: number;
  /** Most the volunteer's cargo bike carries, kg. */
  bikeLoadKg: number;
}

/** Active volunteers with a bike load and a start point, by id. */
export async function availableVolunteers(transaction?: Transaction): Promise<Volunteer[]> {
  const rows = await models().Person.findAll({
    attributes: ["id", "name", "startLat", "startLng", "bikeLoadKg"],
    where: {
      isVolunteer: true,
      status: "active",
      bikeLoadKg: { [Op.ne]: null },
      startLat: { [Op.ne]: null },
      startLng: { [Op.ne]: null },
    },
    order: [["id", "ASC"]],
    transaction,
  });
  return rows.map((p) => ({ id: p.id, name: p.name, lat: p.startLat!, lng: p.startLng!, bikeLoadKg: p.bikeLoadKg! }));
}

export interface MemberRecord {
  id: number;
  name: string;
  status: PersonStatus;
}

/** A household's members, the invited last. */
export async function findMembers(householdId: number, transaction?: Transaction): Promise<MemberRecord[]> {
  const rows = await models().Person.findAll({
    attributes: ["id", "name", "status"],
    where: { householdId },
    order: [
      [sequelize().literal("status = 'invited'"), "ASC"],
      ["name", "ASC"],
      ["id", "ASC"],
    ],
    transaction,
  });
  return rows.map((p) => ({ id: p.id, name: p.name, status: p.status }));
}

/** Members of a household who are not disabled. */
export function countMembers(transaction: Transaction, householdId: number): Promise<number> {
  return models().Person.count({ where: { householdId, status: { [Op.ne]: "disabled" } }, transaction });
}

/** The person's household, the row locked so that two registrations at once cannot both attach one. */
export async function lockPersonHousehold(
  transaction: Transaction,
  personId: number,
): Promise<{ householdId: number | null } | null> {
  const row = await models().Person.findByPk(personId, {
    attributes: ["householdId"],
    lock: transaction.LOCK.UPDATE,
    transaction,
  });
  return row ? { householdId: row.householdId } : null;
}

export async function attachPerson(transaction: Transaction, personId: number, householdId: number): Promise<void> {
  await models().Person.update({ householdId }, { where: { id: personId }, transaction });
}

export async function setName(personId: number, name: string): Promise<void> {
  await models().Person.update({ name }, { where: { id: personId } });
}

/** True when another person already uses this address (case-insensitive, like sign-in). */
export async function emailTaken(transaction: Transaction, email: string, exceptPersonId: number): Promise<boolean> {
  const row = await models().Person.findOne({
    attributes: ["id"],
    where: { email, id: { [Op.ne]: exceptPersonId } },
    transaction,
  });
  return row !== null;
}

export async function setEmail(transaction: Transaction, personId: number, email: string): Promise<void> {
  await models().Person.update({ email }, { where: { id: personId }, transaction });
}
