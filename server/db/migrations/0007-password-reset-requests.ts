import type { Migration } from "../migrator";

// Password reset requests waiting to be looked at. The request route writes one row for every
// address typed, known or not, and answers; the account lookup, the reset link and the e-mail
// happen afterwards (server/jobs/reset-requests.job.ts), so the answer takes the same path and
// time whether an account uses the address (issue 10, point 6). Rows are deleted when handled.
const up = `
CREATE TABLE password_reset_requests (
  id bigserial PRIMARY KEY,
  email text NOT NULL CHECK (char_length(email) <= 254),
  requested_at timestamptz NOT NULL DEFAULT now()
);
`;
const down = `DROP TABLE IF EXISTS password_reset_requests;`;

export const migration: Migration = {
  up: async ({ context }) => {
    await context.sequelize.query(up);
  },
  down: async ({ context }) => {
    await context.sequelize.query(down);
  },
};
