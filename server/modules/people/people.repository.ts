import { QueryTypes, type Transaction } from "sequelize";
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
  const rows = await sequelize().query<PersonRowDb>(`${personRowSelect} ORDER BY p.name, p.id`, {
    type: QueryTypes.SELECT,
  });
  return rows.map(toPersonRow);
}

export async function getPersonRow(id: number, transaction?: Transaction): Promise<PersonRow | null> {
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

export async function householdExists(transaction: Transaction, id: number): Promise<boolean> {
  const rows = await sequelize().query(`SELECT 1 FROM households WHERE id = $1`, {
    bind: [id],
    type: QueryTypes.SELECT,
    transaction,
  });
  return rows.length === 1;
}

export async function insertInvitedPerson(
  transaction: Transaction,
  input: { email: string; name: string; roles: Role[]; householdId: number | null },
): Promise<number> {
  const rows = await sequelize().query<{ id: number }>(
    `INSERT INTO people (email, name, roles, household_id, status) VALUES ($1, $2, $3, $4, 'invited') RETURNING id`,
    { bind: [input.email, input.name, input.roles, input.householdId], type: QueryTypes.SELECT, transaction },
  );
  return rows[0]!.id;
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
  const sets: string[] = [];
  const bind: unknown[] = [id];
  for (const [key, column] of Object.entries(updatable)) {
    const value = changes[key as keyof typeof updatable];
    if (value === undefined) continue;
    bind.push(value);
    sets.push(`${column} = $${bind.length}`);
  }
  if (sets.length === 0) return;
  await sequelize().query(`UPDATE people SET ${sets.join(", ")}, updated_at = now() WHERE id = $1`, {
    bind,
    transaction,
  });
}

export async function removeStewardships(transaction: Transaction, personId: number): Promise<void> {
  await sequelize().query(`DELETE FROM digester_stewards WHERE person_id = $1`, { bind: [personId], transaction });
}

/** Revokes a person's open invitations (a new one replaces them). */
export async function revokeInvitations(transaction: Transaction, personId: number): Promise<void> {
  await sequelize().query(
    `UPDATE invitations SET expires_at = least(expires_at, now()) WHERE person_id = $1 AND used_at IS NULL`,
    {
      bind: [personId],
      transaction,
    },
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
  await sequelize().query(
    `INSERT INTO invitations (token_hash, email, name, roles, invited_by, expires_at, person_id) VALUES ($1, $2, $3, $4, $5, $6, $7)`,
    {
      bind: [input.tokenHash, input.email, input.name, input.roles, input.invitedBy, input.expiresAt, input.personId],
      transaction,
    },
  );
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
  await sequelize().query(
    `UPDATE people SET name = $2, password_hash = $3, status = 'active', password_changed_at = now(), updated_at = now()
      WHERE id = $1 AND status = 'invited'`,
    { bind: [personId, name, passwordHash], transaction },
  );
}

export async function markInvitationUsed(transaction: Transaction, invitationId: number): Promise<void> {
  await sequelize().query(`UPDATE invitations SET used_at = now() WHERE id = $1`, {
    bind: [invitationId],
    transaction,
  });
}

export async function lockDigester(transaction: Transaction, id: number): Promise<boolean> {
  const rows = await sequelize().query(`SELECT 1 FROM digesters WHERE id = $1 FOR UPDATE`, {
    bind: [id],
    type: QueryTypes.SELECT,
    transaction,
  });
  return rows.length === 1;
}

export async function findPeopleByIds(transaction: Transaction, ids: number[]) {
  if (ids.length === 0) return [];
  return sequelize().query<{ id: number; name: string; roles: Role[]; status: PersonStatus }>(
    `SELECT id, name, roles, status FROM people WHERE id = ANY($1::int[])`,
    { bind: [ids], type: QueryTypes.SELECT, transaction },
  );
}

export async function replaceStewards(
  transaction: Transaction,
  digesterId: number,
  personIds: number[],
): Promise<void> {
  await sequelize().query(`DELETE FROM digester_stewards WHERE digester_id = $1`, { bind: [digesterId], transaction });
  if (personIds.length === 0) return;
  await sequelize().query(`INSERT INTO digester_stewards (digester_id, person_id) SELECT $1, unnest($2::int[])`, {
    bind: [digesterId, personIds],
    transaction,
  });
}

export async function stewardsOf(transaction: Transaction, digesterId: number) {
  return sequelize().query<{ id: number; name: string }>(
    `SELECT p.id, p.name FROM digester_stewards ds JOIN people p ON p.id = ds.person_id WHERE ds.digester_id = $1 ORDER BY p.name, p.id`,
    { bind: [digesterId], type: QueryTypes.SELECT, transaction },
  );
}
