import type { Migration } from "../migrator";

// Resident drop-offs: the resident's "nothing from the refuse list" confirmation is kept with the
// drop-off, so a steward who finds refuse can see it was asked; idempotency keys get an index by
// age so a clean-up job can drop old ones without scanning the table.
const up = `
ALTER TABLE drop_offs ADD COLUMN no_refuse_confirmed boolean NOT NULL DEFAULT false;
CREATE INDEX idempotency_keys_created_idx ON idempotency_keys (created_at);
`;

const down = `
DROP INDEX IF EXISTS idempotency_keys_created_idx;
ALTER TABLE drop_offs DROP COLUMN IF EXISTS no_refuse_confirmed;
`;

export const migration: Migration = {
  up: async ({ context }) => {
    await context.sequelize.query(up);
  },
  down: async ({ context }) => {
    await context.sequelize.query(down);
  },
};
