import type { Migration } from "../migrator";

// The steward's day.
//
// 1. Drop-offs remember who accepted or turned them away and when, the steward's note, and the
//    reason when a steward accepted beyond today's budget. Hand feedings keep their mix.
// 2. A daily ledger per digester (`digester_days`) backs the "never over budget" rule with a
//    database constraint. Triggers on drop_offs and feedings keep `committed_kg_vs` equal to
//    what the budget counts (fed + accepted, kg VS) whoever writes those rows, so it cannot
//    drift. A steward's accept or feed first stamps the day's `cap_kg_vs` (the limit computed
//    under the digester's row lock, never below what is already committed) and adds any
//    overridden amount to `override_kg_vs`; then the CHECK refuses a commitment that would
//    exceed cap + override even if two writers raced past the application's check. Rows the
//    app never capped (history, demo data) have a NULL cap and are not checked.
const up = `
ALTER TABLE drop_offs
  ADD COLUMN handled_by_person_id integer REFERENCES people(id) ON DELETE SET NULL,
  ADD COLUMN handled_at timestamptz,
  ADD COLUMN override_reason text CHECK (char_length(override_reason) BETWEEN 1 AND 500),
  ADD COLUMN steward_note text CHECK (char_length(steward_note) <= 500);

ALTER TABLE feedings
  ADD COLUMN mix text CHECK (mix IN ('mixed', 'fruitVeg', 'cooked', 'breadGrains', 'coffee')),
  ADD COLUMN citrus_percent numeric(5,2) NOT NULL DEFAULT 0 CHECK (citrus_percent BETWEEN 0 AND 100);

CREATE TABLE digester_days (
  digester_id integer NOT NULL REFERENCES digesters(id) ON DELETE CASCADE,
  day date NOT NULL,
  committed_kg_vs numeric(12,4) NOT NULL DEFAULT 0,
  cap_kg_vs numeric(12,4) CHECK (cap_kg_vs >= 0),
  override_kg_vs numeric(12,4) NOT NULL DEFAULT 0 CHECK (override_kg_vs >= 0),
  updated_at timestamptz NOT NULL DEFAULT now(),
  PRIMARY KEY (digester_id, day),
  CONSTRAINT committed_within_cap CHECK (cap_kg_vs IS NULL OR committed_kg_vs <= cap_kg_vs + override_kg_vs)
);

INSERT INTO digester_days (digester_id, day, committed_kg_vs)
SELECT digester_id, day, sum(kg_vs) FROM (
  SELECT digester_id, fed_on AS day, kg_vs FROM feedings
  UNION ALL
  SELECT digester_id, for_date AS day, kg_vs FROM drop_offs WHERE status = 'accepted'
) loads
GROUP BY digester_id, day;

CREATE FUNCTION digester_days_add(p_digester_id integer, p_day date, p_kg_vs numeric) RETURNS void
LANGUAGE plpgsql AS $fn$
BEGIN
  IF p_kg_vs IS NULL OR p_kg_vs = 0 THEN
    RETURN;
  ELSIF p_kg_vs < 0 THEN
    -- Taking load off never needs a new row (and must not create one for a digester being deleted).
    UPDATE digester_days SET committed_kg_vs = committed_kg_vs + p_kg_vs, updated_at = now()
     WHERE digester_id = p_digester_id AND day = p_day;
  ELSE
    INSERT INTO digester_days (digester_id, day, committed_kg_vs) VALUES (p_digester_id, p_day, p_kg_vs)
    ON CONFLICT (digester_id, day)
    DO UPDATE SET committed_kg_vs = digester_days.committed_kg_vs + EXCLUDED.committed_kg_vs, updated_at = now();
  END IF;
END
$fn$;

CREATE FUNCTION drop_offs_to_ledger() RETURNS trigger
LANGUAGE plpgsql AS $fn$
BEGIN
  -- Remove the old contribution before adding the new one, so an unchanged row never peaks above the cap.
  IF TG_OP IN ('UPDATE', 'DELETE') AND OLD.status = 'accepted' THEN
    PERFORM digester_days_add(OLD.digester_id, OLD.for_date, -OLD.kg_vs);
  END IF;
  IF TG_OP IN ('INSERT', 'UPDATE') AND NEW.status = 'accepted' THEN
    PERFORM digester_days_add(NEW.digester_id, NEW.for_date, NEW.kg_vs);
  END IF;
  RETURN NULL;
END
$fn$;

CREATE FUNCTION feedings_to_ledger() RETURNS trigger
LANGUAGE plpgsql AS $fn$
BEGIN
  IF TG_OP IN ('UPDATE', 'DELETE') THEN
    PERFORM digester_days_add(OLD.digester_id, OLD.fed_on, -OLD.kg_vs);
  END IF;
  IF TG_OP IN ('INSERT', 'UPDATE') THEN
    PERFORM digester_days_add(NEW.digester_id, NEW.fed_on, NEW.kg_vs);
  END IF;
  RETURN NULL;
END
$fn$;

CREATE TRIGGER drop_offs_to_ledger
  AFTER INSERT OR DELETE OR UPDATE OF status, kg_vs, digester_id, for_date ON drop_offs
  FOR EACH ROW EXECUTE FUNCTION drop_offs_to_ledger();

CREATE TRIGGER feedings_to_ledger
  AFTER INSERT OR DELETE OR UPDATE OF kg_vs, digester_id, fed_on ON feedings
  FOR EACH ROW EXECUTE FUNCTION feedings_to_ledger();
`;

const down = `
DROP TRIGGER IF EXISTS feedings_to_ledger ON feedings;
DROP TRIGGER IF EXISTS drop_offs_to_ledger ON drop_offs;
DROP FUNCTION IF EXISTS feedings_to_ledger();
DROP FUNCTION IF EXISTS drop_offs_to_ledger();
DROP FUNCTION IF EXISTS digester_days_add(integer, date, numeric);
DROP TABLE IF EXISTS digester_days;
ALTER TABLE feedings DROP COLUMN IF EXISTS citrus_percent, DROP COLUMN IF EXISTS mix;
ALTER TABLE drop_offs DROP COLUMN IF EXISTS steward_note, DROP COLUMN IF EXISTS override_reason,
  DROP COLUMN IF EXISTS handled_at, DROP COLUMN IF EXISTS handled_by_person_id;
`;

export const migration: Migration = {
  up: async ({ context }) => {
    await context.sequelize.query(up);
  },
  down: async ({ context }) => {
    await context.sequelize.query(down);
  },
};
