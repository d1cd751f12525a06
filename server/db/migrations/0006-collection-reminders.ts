import type { Migration } from "../migrator";

// The day-before reminder of a collection round: when its volunteer and households were e-mailed
// (null until then), so each round is reminded once however many app processes run the job.
const up = `ALTER TABLE collection_rounds ADD COLUMN reminded_at timestamptz;`;
const down = `ALTER TABLE collection_rounds DROP COLUMN IF EXISTS reminded_at;`;

export const migration: Migration = {
  up: async ({ context }) => {
    await context.sequelize.query(up);
  },
  down: async ({ context }) => {
    await context.sequelize.query(down);
  },
};
