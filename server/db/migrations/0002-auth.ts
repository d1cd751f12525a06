import type { Migration } from "../migrator";

// Sign-in support: the failed-sign-in counter (shared by every app process, so a restart or a
// second instance does not reset it), an index to end one person's sessions at once, and the
// link from an invitation to the person row it created.
const up = `
CREATE TABLE rate_limit_hits (
  key text PRIMARY KEY CHECK (char_length(key) <= 200),
  hits integer NOT NULL CHECK (hits >= 0),
  reset_at timestamptz NOT NULL
);
CREATE INDEX rate_limit_hits_reset_idx ON rate_limit_hits (reset_at);

-- Disabling a person or changing a password deletes that person's session rows.
CREATE INDEX sessions_person_idx ON sessions ((sess -> 'passport' ->> 'user'));

ALTER TABLE invitations ADD COLUMN person_id integer REFERENCES people(id) ON DELETE CASCADE;
CREATE INDEX invitations_person_idx ON invitations (person_id);
CREATE INDEX password_resets_person_idx ON password_resets (person_id, created_at);
CREATE INDEX outbox_emails_status_idx ON outbox_emails (status, created_at DESC);
`;

const down = `
DROP INDEX IF EXISTS outbox_emails_status_idx;
DROP INDEX IF EXISTS password_resets_person_idx;
DROP INDEX IF EXISTS invitations_person_idx;
ALTER TABLE invitations DROP COLUMN IF EXISTS person_id;
DROP INDEX IF EXISTS sessions_person_idx;
DROP TABLE IF EXISTS rate_limit_hits;
`;

export const migration: Migration = {
  up: async ({ context }) => {
    await context.sequelize.query(up);
  },
  down: async ({ context }) => {
    await context.sequelize.query(down);
  },
};
