import type { Migration } from "../migrator";

// The core schema. Rules that protect the data (non-negative quantities, valid statuses,
// foreign keys) live here in the database, not only in code.
const up = `
CREATE EXTENSION IF NOT EXISTS citext;

CREATE TABLE digesters (
  id serial PRIMARY KEY,
  name text NOT NULL CHECK (char_length(name) BETWEEN 1 AND 120),
  site_description text NOT NULL DEFAULT '' CHECK (char_length(site_description) <= 500),
  lat double precision NOT NULL CHECK (lat BETWEEN -90 AND 90),
  lng double precision NOT NULL CHECK (lng BETWEEN -180 AND 180),
  working_volume_m3 numeric(8,3) NOT NULL CHECK (working_volume_m3 > 0 AND working_volume_m3 <= 100),
  drum_diameter_m numeric(6,3) CHECK (drum_diameter_m > 0 AND drum_diameter_m <= 10),
  drum_mass_kg numeric(8,2) CHECK (drum_mass_kg >= 0),
  added_mass_kg numeric(8,2) NOT NULL DEFAULT 0 CHECK (added_mass_kg >= 0),
  burner_litres_per_hour numeric(8,1) NOT NULL DEFAULT 350 CHECK (burner_litres_per_hour > 0),
  heating text NOT NULL DEFAULT 'none' CHECK (heating IN ('none', 'solar', 'electric', 'waste-heat')),
  insulation text NOT NULL DEFAULT 'none' CHECK (insulation IN ('none', 'partial', 'full')),
  status text NOT NULL DEFAULT 'active' CHECK (status IN ('active', 'resting', 'offline')),
  status_reason text CHECK (char_length(status_reason) <= 500),
  started_on date NOT NULL,
  gas_first_burned_on date,
  olr_ref_kg_vs_per_m3_day numeric(5,2) NOT NULL DEFAULT 1.5 CHECK (olr_ref_kg_vs_per_m3_day > 0 AND olr_ref_kg_vs_per_m3_day <= 4),
  olr_override_reason text,
  target_ts_percent numeric(5,2) NOT NULL DEFAULT 8 CHECK (target_ts_percent BETWEEN 2 AND 15),
  bucket_kg_per_litre numeric(4,2) NOT NULL DEFAULT 0.5 CHECK (bucket_kg_per_litre BETWEEN 0.1 AND 1.2),
  created_at timestamptz NOT NULL DEFAULT now(),
  updated_at timestamptz NOT NULL DEFAULT now(),
  CONSTRAINT olr_above_cap_needs_reason CHECK (olr_ref_kg_vs_per_m3_day <= 2.0 OR olr_override_reason IS NOT NULL),
  CONSTRAINT not_active_needs_reason CHECK (status = 'active' OR status_reason IS NOT NULL)
);

CREATE TABLE households (
  id serial PRIMARY KEY,
  name text NOT NULL CHECK (char_length(name) BETWEEN 1 AND 120),
  address_text text NOT NULL DEFAULT '' CHECK (char_length(address_text) <= 200),
  lat double precision CHECK (lat BETWEEN -90 AND 90),
  lng double precision CHECK (lng BETWEEN -180 AND 180),
  assigned_digester_id integer REFERENCES digesters(id) ON DELETE SET NULL,
  assignment_pinned boolean NOT NULL DEFAULT false,
  declared_weekly_kg numeric(8,2) NOT NULL DEFAULT 3 CHECK (declared_weekly_kg >= 0 AND declared_weekly_kg <= 500),
  created_at timestamptz NOT NULL DEFAULT now(),
  updated_at timestamptz NOT NULL DEFAULT now(),
  CONSTRAINT location_both_or_neither CHECK ((lat IS NULL) = (lng IS NULL))
);
CREATE INDEX households_assigned_digester_idx ON households (assigned_digester_id);

CREATE TABLE people (
  id serial PRIMARY KEY,
  email citext NOT NULL UNIQUE CHECK (char_length(email) BETWEEN 3 AND 254),
  name text NOT NULL CHECK (char_length(name) BETWEEN 1 AND 120),
  password_hash text,
  status text NOT NULL DEFAULT 'active' CHECK (status IN ('invited', 'active', 'disabled')),
  roles text[] NOT NULL DEFAULT '{}' CHECK (roles <@ ARRAY['resident', 'steward', 'coordinator', 'gardener']::text[]),
  household_id integer REFERENCES households(id) ON DELETE SET NULL,
  is_volunteer boolean NOT NULL DEFAULT false,
  bike_load_kg numeric(6,1) CHECK (bike_load_kg > 0 AND bike_load_kg <= 500),
  start_lat double precision CHECK (start_lat BETWEEN -90 AND 90),
  start_lng double precision CHECK (start_lng BETWEEN -180 AND 180),
  password_changed_at timestamptz,
  created_at timestamptz NOT NULL DEFAULT now(),
  updated_at timestamptz NOT NULL DEFAULT now(),
  CONSTRAINT active_needs_password CHECK (status <> 'active' OR password_hash IS NOT NULL)
);
CREATE INDEX people_household_idx ON people (household_id);

CREATE TABLE digester_stewards (
  digester_id integer NOT NULL REFERENCES digesters(id) ON DELETE CASCADE,
  person_id integer NOT NULL REFERENCES people(id) ON DELETE CASCADE,
  PRIMARY KEY (digester_id, person_id)
);
CREATE INDEX digester_stewards_person_idx ON digester_stewards (person_id);

CREATE TABLE drop_offs (
  id serial PRIMARY KEY,
  household_id integer NOT NULL REFERENCES households(id) ON DELETE CASCADE,
  digester_id integer NOT NULL REFERENCES digesters(id) ON DELETE RESTRICT,
  person_id integer REFERENCES people(id) ON DELETE SET NULL,
  for_date date NOT NULL,
  bucket_count integer CHECK (bucket_count BETWEEN 1 AND 20),
  bucket_litres numeric(5,1) CHECK (bucket_litres > 0 AND bucket_litres <= 60),
  weight_kg numeric(7,2) CHECK (weight_kg > 0 AND weight_kg <= 200),
  mass_source text NOT NULL CHECK (mass_source IN ('weighed', 'estimated')),
  fresh_kg numeric(8,3) NOT NULL CHECK (fresh_kg > 0),
  kg_vs numeric(8,4) NOT NULL CHECK (kg_vs >= 0),
  mix text NOT NULL DEFAULT 'mixed' CHECK (mix IN ('mixed', 'fruitVeg', 'cooked', 'breadGrains', 'coffee')),
  citrus_percent numeric(5,2) NOT NULL DEFAULT 0 CHECK (citrus_percent BETWEEN 0 AND 100),
  status text NOT NULL DEFAULT 'pending' CHECK (status IN ('pending', 'accepted', 'fed', 'turned_away', 'cancelled')),
  turned_away_reason text CHECK (turned_away_reason IN ('contamination', 'too_much_citrus', 'over_budget', 'other')),
  note text CHECK (char_length(note) <= 500),
  created_at timestamptz NOT NULL DEFAULT now(),
  updated_at timestamptz NOT NULL DEFAULT now(),
  CONSTRAINT buckets_or_weight CHECK ((bucket_count IS NOT NULL AND bucket_litres IS NOT NULL) OR weight_kg IS NOT NULL),
  CONSTRAINT turned_away_has_reason CHECK ((status = 'turned_away') = (turned_away_reason IS NOT NULL))
);
CREATE INDEX drop_offs_digester_date_idx ON drop_offs (digester_id, for_date);
CREATE INDEX drop_offs_household_idx ON drop_offs (household_id, for_date DESC);

CREATE TABLE feedings (
  id serial PRIMARY KEY,
  digester_id integer NOT NULL REFERENCES digesters(id) ON DELETE CASCADE,
  fed_on date NOT NULL,
  fed_at timestamptz NOT NULL DEFAULT now(),
  fresh_kg numeric(8,3) NOT NULL CHECK (fresh_kg >= 0),
  kg_vs numeric(8,4) NOT NULL CHECK (kg_vs >= 0),
  water_litres numeric(8,2) NOT NULL DEFAULT 0 CHECK (water_litres >= 0),
  drop_off_id integer UNIQUE REFERENCES drop_offs(id) ON DELETE SET NULL,
  person_id integer REFERENCES people(id) ON DELETE SET NULL,
  override_reason text CHECK (char_length(override_reason) <= 500),
  note text CHECK (char_length(note) <= 500),
  created_at timestamptz NOT NULL DEFAULT now()
);
CREATE INDEX feedings_digester_date_idx ON feedings (digester_id, fed_on);

CREATE TABLE readings (
  id bigserial PRIMARY KEY,
  digester_id integer NOT NULL REFERENCES digesters(id) ON DELETE CASCADE,
  taken_at timestamptz NOT NULL,
  temperature_c numeric(5,2) CHECK (temperature_c BETWEEN -40 AND 90),
  ph numeric(4,2) CHECK (ph BETWEEN 0 AND 14),
  vfa_ta_ratio numeric(5,3) CHECK (vfa_ta_ratio BETWEEN 0 AND 5),
  titration_a_ml numeric(6,2) CHECK (titration_a_ml >= 0),
  titration_b_ml numeric(6,2) CHECK (titration_b_ml >= 0),
  gas_level_percent numeric(5,1) CHECK (gas_level_percent BETWEEN 0 AND 100),
  drum_rise_m numeric(5,3) CHECK (drum_rise_m >= 0),
  gas_used_minutes numeric(6,1) CHECK (gas_used_minutes >= 0),
  note text CHECK (char_length(note) <= 500),
  source text NOT NULL DEFAULT 'manual' CHECK (source IN ('manual', 'upload')),
  person_id integer REFERENCES people(id) ON DELETE SET NULL,
  created_at timestamptz NOT NULL DEFAULT now()
);
CREATE INDEX readings_digester_time_idx ON readings (digester_id, taken_at);
-- Re-uploading the same sensor rows must not duplicate them.
CREATE UNIQUE INDEX readings_upload_unique ON readings (digester_id, taken_at) WHERE source = 'upload';

CREATE TABLE fertiliser_claims (
  id serial PRIMARY KEY,
  digester_id integer NOT NULL REFERENCES digesters(id) ON DELETE CASCADE,
  person_id integer NOT NULL REFERENCES people(id) ON DELETE CASCADE,
  litres numeric(8,1) NOT NULL CHECK (litres > 0),
  window_start timestamptz NOT NULL,
  window_end timestamptz NOT NULL,
  bed_area_m2 numeric(8,1) CHECK (bed_area_m2 > 0),
  status text NOT NULL DEFAULT 'claimed' CHECK (status IN ('claimed', 'collected', 'cancelled')),
  created_at timestamptz NOT NULL DEFAULT now(),
  updated_at timestamptz NOT NULL DEFAULT now(),
  CHECK (window_end > window_start)
);

CREATE TABLE collection_requests (
  id serial PRIMARY KEY,
  household_id integer NOT NULL REFERENCES households(id) ON DELETE CASCADE,
  for_date date NOT NULL,
  bucket_count integer NOT NULL CHECK (bucket_count BETWEEN 1 AND 20),
  status text NOT NULL DEFAULT 'open' CHECK (status IN ('open', 'planned', 'collected', 'cancelled')),
  created_at timestamptz NOT NULL DEFAULT now(),
  updated_at timestamptz NOT NULL DEFAULT now()
);

CREATE TABLE idempotency_keys (
  person_id integer NOT NULL REFERENCES people(id) ON DELETE CASCADE,
  key text NOT NULL CHECK (char_length(key) BETWEEN 1 AND 200),
  route text NOT NULL,
  request_hash text NOT NULL,
  status_code integer NOT NULL,
  response jsonb NOT NULL,
  created_at timestamptz NOT NULL DEFAULT now(),
  PRIMARY KEY (person_id, key)
);

CREATE TABLE outbox_emails (
  id bigserial PRIMARY KEY,
  to_address text NOT NULL,
  subject text NOT NULL,
  text_body text NOT NULL,
  html_body text,
  message_id text NOT NULL UNIQUE,
  status text NOT NULL DEFAULT 'pending' CHECK (status IN ('pending', 'sent', 'failed')),
  attempts integer NOT NULL DEFAULT 0 CHECK (attempts >= 0),
  next_attempt_at timestamptz NOT NULL DEFAULT now(),
  last_error text,
  dedupe_key text UNIQUE,
  created_at timestamptz NOT NULL DEFAULT now(),
  sent_at timestamptz
);
CREATE INDEX outbox_emails_due_idx ON outbox_emails (next_attempt_at) WHERE status = 'pending';

CREATE TABLE invitations (
  id serial PRIMARY KEY,
  token_hash text NOT NULL UNIQUE,
  email citext NOT NULL,
  name text NOT NULL DEFAULT '',
  roles text[] NOT NULL DEFAULT '{}' CHECK (roles <@ ARRAY['resident', 'steward', 'coordinator', 'gardener']::text[]),
  invited_by integer REFERENCES people(id) ON DELETE SET NULL,
  expires_at timestamptz NOT NULL,
  used_at timestamptz,
  created_at timestamptz NOT NULL DEFAULT now()
);

CREATE TABLE password_resets (
  id serial PRIMARY KEY,
  token_hash text NOT NULL UNIQUE,
  person_id integer NOT NULL REFERENCES people(id) ON DELETE CASCADE,
  expires_at timestamptz NOT NULL,
  used_at timestamptz,
  created_at timestamptz NOT NULL DEFAULT now()
);

-- connect-pg-simple's table, created here so the app never needs DDL rights at run time.
CREATE TABLE sessions (
  sid varchar NOT NULL PRIMARY KEY,
  sess json NOT NULL,
  expire timestamp(6) NOT NULL
);
CREATE INDEX sessions_expire_idx ON sessions (expire);
`;

const down = `
DROP TABLE IF EXISTS sessions, password_resets, invitations, outbox_emails, idempotency_keys,
  collection_requests, fertiliser_claims, readings, feedings, drop_offs, digester_stewards,
  people, households, digesters CASCADE;
`;

export const migration: Migration = {
  up: async ({ context }) => {
    await context.sequelize.query(up);
  },
  down: async ({ context }) => {
    await context.sequelize.query(down);
  },
};
