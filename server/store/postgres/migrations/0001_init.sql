-- 0001_init (PostgreSQL): sites, set-up, rounds and append-only readings.
--
-- The same tables, columns, checks and triggers as server/store/sqlite/migrations/0001_init.sql,
-- so both stores answer alike. Conventions kept from SQLite on purpose:
-- ids are UUID text; times are ISO 8601 UTC text ("2026-03-02T08:15:00.000Z", text
-- order is time order); text columns use the "C" collation (byte order, as SQLite's
-- BINARY); JSON columns are `json` (checked on insert, text kept as written).
-- areas and spots carry `seq` (insertion order, what SQLite's rowid gives).
-- Readings are append-only: triggers refuse UPDATE and DELETE on readings and
-- reading_tombstones.

CREATE TABLE sites (
  id          TEXT COLLATE "C" PRIMARY KEY,
  name        TEXT COLLATE "C" NOT NULL,
  time_zone   TEXT COLLATE "C" NOT NULL,
  notes       TEXT COLLATE "C" NOT NULL DEFAULT '',
  created_at  TEXT COLLATE "C" NOT NULL,
  updated_at  TEXT COLLATE "C" NOT NULL
);

CREATE TABLE limit_sets (
  id          TEXT COLLATE "C" PRIMARY KEY,
  site_id     TEXT COLLATE "C" NOT NULL REFERENCES sites (id),
  name        TEXT COLLATE "C" NOT NULL,
  description TEXT COLLATE "C" NOT NULL DEFAULT '',
  rules       JSON NOT NULL,
  created_at  TEXT COLLATE "C" NOT NULL,
  updated_at  TEXT COLLATE "C" NOT NULL
);
CREATE INDEX limit_sets_site ON limit_sets (site_id);

CREATE TABLE areas (
  id            TEXT COLLATE "C" PRIMARY KEY,
  seq           BIGINT GENERATED ALWAYS AS IDENTITY UNIQUE,
  site_id       TEXT COLLATE "C" NOT NULL REFERENCES sites (id),
  name          TEXT COLLATE "C" NOT NULL,
  kind          TEXT COLLATE "C" NOT NULL CHECK (kind IN ('epa', 'hazardous', 'general')),
  zone          INTEGER CHECK (zone IS NULL OR zone IN (0, 1, 2, 20, 21, 22)),
  gas_group     TEXT COLLATE "C" CHECK (gas_group IS NULL OR gas_group IN ('IIA', 'IIB', 'IIC')),
  substance_id  TEXT COLLATE "C",
  dust_mie_j    DOUBLE PRECISION,
  limit_set_id  TEXT COLLATE "C" REFERENCES limit_sets (id),
  notes         TEXT COLLATE "C" NOT NULL DEFAULT '',
  created_at    TEXT COLLATE "C" NOT NULL,
  updated_at    TEXT COLLATE "C" NOT NULL
);
CREATE INDEX areas_site ON areas (site_id);

CREATE TABLE spots (
  id                      TEXT COLLATE "C" PRIMARY KEY,
  seq                     BIGINT GENERATED ALWAYS AS IDENTITY UNIQUE,
  site_id                 TEXT COLLATE "C" NOT NULL REFERENCES sites (id),
  area_id                 TEXT COLLATE "C" NOT NULL REFERENCES areas (id),
  name                    TEXT COLLATE "C" NOT NULL,
  -- printed on the spot's QR label; unique within a site whatever the letter case (index below)
  code                    TEXT COLLATE "C" NOT NULL,
  object_kind             TEXT COLLATE "C" NOT NULL,
  material_class          TEXT COLLATE "C" NOT NULL,
  model                   TEXT COLLATE "C",
  geometry                JSON NOT NULL DEFAULT '{}',
  default_distance_value  DOUBLE PRECISION NOT NULL,
  default_distance_unit   TEXT COLLATE "C" NOT NULL,
  distance_uncertainty_m  DOUBLE PRECISION,
  route_position          INTEGER NOT NULL DEFAULT 0,
  notes                   TEXT COLLATE "C" NOT NULL DEFAULT '',
  retired_at              TEXT COLLATE "C",
  retired_reason          TEXT COLLATE "C",
  created_at              TEXT COLLATE "C" NOT NULL,
  updated_at              TEXT COLLATE "C" NOT NULL
);
-- SQLite: code COLLATE NOCASE with UNIQUE (site_id, code)
CREATE UNIQUE INDEX spots_site_code ON spots (site_id, lower(code));
CREATE INDEX spots_area_route ON spots (area_id, route_position);

CREATE TABLE meters (
  id                     TEXT COLLATE "C" PRIMARY KEY,
  site_id                TEXT COLLATE "C" NOT NULL REFERENCES sites (id),
  serial                 TEXT COLLATE "C" NOT NULL,
  label                  TEXT COLLATE "C" NOT NULL DEFAULT '',
  modes                  JSON NOT NULL,
  calibrated_distance_m  DOUBLE PRECISION,
  accuracy_rel           DOUBLE PRECISION NOT NULL,
  geometry_factor        DOUBLE PRECISION NOT NULL,
  calibration_due        TEXT COLLATE "C" NOT NULL,
  default_unit           TEXT COLLATE "C" NOT NULL,
  created_at             TEXT COLLATE "C" NOT NULL,
  updated_at             TEXT COLLATE "C" NOT NULL,
  UNIQUE (site_id, serial)
);

CREATE TABLE rounds (
  id                TEXT COLLATE "C" PRIMARY KEY,         -- made by the tablet (UUIDv7)
  site_id           TEXT COLLATE "C" NOT NULL REFERENCES sites (id),
  surveyor          TEXT COLLATE "C" NOT NULL,
  started_at        TEXT COLLATE "C" NOT NULL,
  ended_at          TEXT COLLATE "C",
  rh_percent        DOUBLE PRECISION,
  temperature_c     DOUBLE PRECISION,
  notes             TEXT COLLATE "C" NOT NULL DEFAULT '',
  planned_spot_ids  JSON NOT NULL,
  content_hash      TEXT COLLATE "C" NOT NULL,            -- of the input as first posted: tells a retry from a clash
  created_at        TEXT COLLATE "C" NOT NULL
);
CREATE INDEX rounds_site_started ON rounds (site_id, started_at);

CREATE TABLE round_skips (
  id          TEXT COLLATE "C" PRIMARY KEY,               -- made by the tablet (UUIDv7)
  round_id    TEXT COLLATE "C" NOT NULL REFERENCES rounds (id),
  spot_id     TEXT COLLATE "C" NOT NULL REFERENCES spots (id),
  reason      TEXT COLLATE "C" NOT NULL,
  at          TEXT COLLATE "C" NOT NULL,
  created_at  TEXT COLLATE "C" NOT NULL
);
CREATE INDEX round_skips_round ON round_skips (round_id);

CREATE TABLE readings (
  id                           TEXT COLLATE "C" PRIMARY KEY,   -- made by the tablet (UUIDv7: time-ordered inserts)
  round_id                     TEXT COLLATE "C" NOT NULL REFERENCES rounds (id),
  spot_id                      TEXT COLLATE "C" NOT NULL REFERENCES spots (id),
  meter_id                     TEXT COLLATE "C" NOT NULL REFERENCES meters (id),
  taken_at                     TEXT COLLATE "C" NOT NULL,
  received_at                  TEXT COLLATE "C" NOT NULL,
  -- inputs exactly as entered
  value                        DOUBLE PRECISION NOT NULL,
  unit                         TEXT COLLATE "C" NOT NULL,
  polarity                     TEXT COLLATE "C" NOT NULL CHECK (polarity IN ('+', '-')),
  meter_range                  TEXT COLLATE "C" NOT NULL DEFAULT '',
  distance_value               DOUBLE PRECISION NOT NULL,
  distance_unit                TEXT COLLATE "C" NOT NULL,
  distance_uncertainty_m       DOUBLE PRECISION,
  side                         TEXT COLLATE "C",
  ground_behind_value          DOUBLE PRECISION,
  ground_behind_unit           TEXT COLLATE "C",
  zeroed                       INTEGER NOT NULL CHECK (zeroed IN (0, 1)),
  rh_percent                   DOUBLE PRECISION,
  temperature_c                DOUBLE PRECISION,
  process                      JSON,
  note                         TEXT COLLATE "C" NOT NULL DEFAULT '',
  -- the meter's settings when the reading arrived (a later re-calibration must not rewrite history)
  meter_calibrated_distance_m  DOUBLE PRECISION,
  meter_calibration_due        TEXT COLLATE "C" NOT NULL,
  -- revisions
  supersedes_id                TEXT COLLATE "C" REFERENCES readings (id),
  correction_reason            TEXT COLLATE "C",
  content_hash                 TEXT COLLATE "C" NOT NULL,      -- canonical JSON of the input: an identical retry is a duplicate
  -- derived cache for indexes (recomputed by core/ on read; stamped with its version)
  field_v_per_m                DOUBLE PRECISION NOT NULL,
  derive_version               INTEGER NOT NULL,
  flags                        JSON NOT NULL DEFAULT '[]',
  CHECK ((supersedes_id IS NULL) = (correction_reason IS NULL))
);
-- Per-spot time series and weekly review: covering, so year-scale scans never touch the table.
CREATE INDEX readings_spot_time ON readings (spot_id, taken_at, field_v_per_m);
CREATE INDEX readings_round ON readings (round_id);
-- At most one correction per revision: history stays a line, never a tree.
CREATE UNIQUE INDEX readings_supersedes ON readings (supersedes_id) WHERE supersedes_id IS NOT NULL;

CREATE TABLE reading_tombstones (
  reading_id  TEXT COLLATE "C" PRIMARY KEY REFERENCES readings (id),
  reason      TEXT COLLATE "C" NOT NULL,
  at          TEXT COLLATE "C" NOT NULL
);

-- A resent reading whose content differs from the stored one: kept for review, never applied.
CREATE TABLE reading_conflicts (
  id            TEXT COLLATE "C" PRIMARY KEY,
  reading_id    TEXT COLLATE "C" NOT NULL REFERENCES readings (id),
  payload       JSON NOT NULL,
  content_hash  TEXT COLLATE "C" NOT NULL,
  received_at   TEXT COLLATE "C" NOT NULL,
  UNIQUE (reading_id, content_hash)
);

-- Append-only: like SQLite's RAISE(ABORT), refuse the statement (the store maps it to 'invalid').
CREATE FUNCTION chargewalk_append_only() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  RAISE EXCEPTION '%', TG_ARGV[0] USING ERRCODE = 'restrict_violation';
END;
$$;

CREATE TRIGGER readings_append_only_update BEFORE UPDATE ON readings
  FOR EACH ROW EXECUTE FUNCTION chargewalk_append_only('readings are append-only: post a correction instead');
CREATE TRIGGER readings_append_only_delete BEFORE DELETE ON readings
  FOR EACH ROW EXECUTE FUNCTION chargewalk_append_only('readings are append-only: post a tombstone instead');
CREATE TRIGGER readings_append_only_truncate BEFORE TRUNCATE ON readings
  FOR EACH STATEMENT EXECUTE FUNCTION chargewalk_append_only('readings are append-only');
CREATE TRIGGER reading_tombstones_append_only_update BEFORE UPDATE ON reading_tombstones
  FOR EACH ROW EXECUTE FUNCTION chargewalk_append_only('tombstones are append-only');
CREATE TRIGGER reading_tombstones_append_only_delete BEFORE DELETE ON reading_tombstones
  FOR EACH ROW EXECUTE FUNCTION chargewalk_append_only('tombstones are append-only');
CREATE TRIGGER reading_tombstones_append_only_truncate BEFORE TRUNCATE ON reading_tombstones
  FOR EACH STATEMENT EXECUTE FUNCTION chargewalk_append_only('tombstones are append-only');
