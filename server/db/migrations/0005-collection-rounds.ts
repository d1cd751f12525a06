import type { Migration } from "../migrator";

// Collection rounds: a volunteer's cargo-bike round on a date, ending at a digester, with its
// stops (collection requests) in order. A request is on at most one live round.
const up = `
CREATE TABLE collection_rounds (
  id serial PRIMARY KEY,
  for_date date NOT NULL,
  volunteer_id integer NOT NULL REFERENCES people(id) ON DELETE CASCADE,
  end_digester_id integer NOT NULL REFERENCES digesters(id) ON DELETE RESTRICT,
  total_m numeric(10,1) NOT NULL CHECK (total_m >= 0),
  load_kg numeric(8,2) NOT NULL DEFAULT 0 CHECK (load_kg >= 0),
  status text NOT NULL DEFAULT 'planned' CHECK (status IN ('planned', 'done', 'cancelled')),
  created_at timestamptz NOT NULL DEFAULT now(),
  updated_at timestamptz NOT NULL DEFAULT now()
);
CREATE INDEX collection_rounds_date_idx ON collection_rounds (for_date);
CREATE INDEX collection_rounds_volunteer_idx ON collection_rounds (volunteer_id, for_date);

CREATE TABLE collection_round_stops (
  round_id integer NOT NULL REFERENCES collection_rounds(id) ON DELETE CASCADE,
  request_id integer NOT NULL REFERENCES collection_requests(id) ON DELETE CASCADE,
  seq integer NOT NULL CHECK (seq >= 1),
  drop_off_id integer REFERENCES drop_offs(id) ON DELETE SET NULL,
  PRIMARY KEY (round_id, request_id),
  UNIQUE (round_id, seq)
);
CREATE UNIQUE INDEX collection_round_stops_request_idx ON collection_round_stops (request_id);
CREATE INDEX collection_requests_date_idx ON collection_requests (for_date, status);
CREATE INDEX collection_requests_household_idx ON collection_requests (household_id, for_date);
`;

const down = `
DROP INDEX IF EXISTS collection_requests_household_idx;
DROP INDEX IF EXISTS collection_requests_date_idx;
DROP TABLE IF EXISTS collection_round_stops, collection_rounds;
`;

export const migration: Migration = {
  up: async ({ context }) => {
    await context.sequelize.query(up);
  },
  down: async ({ context }) => {
    await context.sequelize.query(down);
  },
};
