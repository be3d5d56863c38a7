-- 0001_init: sites, set-up, rounds and append-only readings.
--
-- Conventions: ids are UUID text; times are ISO 8601 UTC text
-- ("2026-03-02T08:15:00.000Z", so text order is time order); JSON columns are
-- checked with json_valid and their shape by zod in the repository that owns them.
-- Readings are append-only: a correction is a new row whose supersedes_id points
-- at the old one, a delete is a row in reading_tombstones; triggers refuse
-- UPDATE and DELETE on both.

CREATE TABLE sites (
  id          TEXT PRIMARY KEY,
  name        TEXT NOT NULL,
  time_zone   TEXT NOT NULL,
  notes       TEXT NOT NULL DEFAULT '',
  created_at  TEXT NOT NULL,
  updated_at  TEXT NOT NULL
) STRICT;

CREATE TABLE limit_sets (
  id          TEXT PRIMARY KEY,
  site_id     TEXT NOT NULL REFERENCES sites (id),
  name        TEXT NOT NULL,
  description TEXT NOT NULL DEFAULT '',
  rules       TEXT NOT NULL CHECK (json_valid(rules)),
  created_at  TEXT NOT NULL,
  updated_at  TEXT NOT NULL
) STRICT;
CREATE INDEX limit_sets_site ON limit_sets (site_id);

CREATE TABLE areas (
  id            TEXT PRIMARY KEY,
  site_id       TEXT NOT NULL REFERENCES sites (id),
  name          TEXT NOT NULL,
  kind          TEXT NOT NULL CHECK (kind IN ('epa', 'hazardous', 'general')),
  zone          INTEGER CHECK (zone IS NULL OR zone IN (0, 1, 2, 20, 21, 22)),
  gas_group     TEXT CHECK (gas_group IS NULL OR gas_group IN ('IIA', 'IIB', 'IIC')),
  substance_id  TEXT,
  dust_mie_j    REAL,
  limit_set_id  TEXT REFERENCES limit_sets (id),
  notes         TEXT NOT NULL DEFAULT '',
  created_at    TEXT NOT NULL,
  updated_at    TEXT NOT NULL
) STRICT;
CREATE INDEX areas_site ON areas (site_id);

CREATE TABLE spots (
  id                      TEXT PRIMARY KEY,
  site_id                 TEXT NOT NULL REFERENCES sites (id),
  area_id                 TEXT NOT NULL REFERENCES areas (id),
  name                    TEXT NOT NULL,
  -- printed on the spot's QR label; unique within a site whatever the letter case
  code                    TEXT NOT NULL COLLATE NOCASE,
  object_kind             TEXT NOT NULL,
  material_class          TEXT NOT NULL,
  model                   TEXT,
  geometry                TEXT NOT NULL DEFAULT '{}' CHECK (json_valid(geometry)),
  default_distance_value  REAL NOT NULL,
  default_distance_unit   TEXT NOT NULL,
  distance_uncertainty_m  REAL,
  route_position          INTEGER NOT NULL DEFAULT 0,
  notes                   TEXT NOT NULL DEFAULT '',
  retired_at              TEXT,
  retired_reason          TEXT,
  created_at              TEXT NOT NULL,
  updated_at              TEXT NOT NULL,
  UNIQUE (site_id, code)
) STRICT;
CREATE INDEX spots_area_route ON spots (area_id, route_position);

CREATE TABLE meters (
  id                     TEXT PRIMARY KEY,
  site_id                TEXT NOT NULL REFERENCES sites (id),
  serial                 TEXT NOT NULL,
  label                  TEXT NOT NULL DEFAULT '',
  modes                  TEXT NOT NULL CHECK (json_valid(modes)),
  calibrated_distance_m  REAL,
  accuracy_rel           REAL NOT NULL,
  geometry_factor        REAL NOT NULL,
  calibration_due        TEXT NOT NULL,
  default_unit           TEXT NOT NULL,
  created_at             TEXT NOT NULL,
  updated_at             TEXT NOT NULL,
  UNIQUE (site_id, serial)
) STRICT;

CREATE TABLE rounds (
  id                TEXT PRIMARY KEY,         -- made by the tablet (UUIDv7)
  site_id           TEXT NOT NULL REFERENCES sites (id),
  surveyor          TEXT NOT NULL,
  started_at        TEXT NOT NULL,
  ended_at          TEXT,
  rh_percent        REAL,
  temperature_c     REAL,
  notes             TEXT NOT NULL DEFAULT '',
  planned_spot_ids  TEXT NOT NULL CHECK (json_valid(planned_spot_ids)),
  content_hash      TEXT NOT NULL,            -- of the input as first posted: tells a retry from a clash
  created_at        TEXT NOT NULL
) STRICT;
CREATE INDEX rounds_site_started ON rounds (site_id, started_at);

CREATE TABLE round_skips (
  id          TEXT PRIMARY KEY,               -- made by the tablet (UUIDv7)
  round_id    TEXT NOT NULL REFERENCES rounds (id),
  spot_id     TEXT NOT NULL REFERENCES spots (id),
  reason      TEXT NOT NULL,
  at          TEXT NOT NULL,
  created_at  TEXT NOT NULL
) STRICT;
CREATE INDEX round_skips_round ON round_skips (round_id);

CREATE TABLE readings (
  id                           TEXT PRIMARY KEY,   -- made by the tablet (UUIDv7: time-ordered inserts)
  round_id                     TEXT NOT NULL REFERENCES rounds (id),
  spot_id                      TEXT NOT NULL REFERENCES spots (id),
  meter_id                     TEXT NOT NULL REFERENCES meters (id),
  taken_at                     TEXT NOT NULL,
  received_at                  TEXT NOT NULL,
  -- inputs exactly as entered
  value                        REAL NOT NULL,
  unit                         TEXT NOT NULL,
  polarity                     TEXT NOT NULL CHECK (polarity IN ('+', '-')),
  meter_range                  TEXT NOT NULL DEFAULT '',
  distance_value               REAL NOT NULL,
  distance_unit                TEXT NOT NULL,
  distance_uncertainty_m       REAL,
  side                         TEXT,
  ground_behind_value          REAL,
  ground_behind_unit           TEXT,
  zeroed                       INTEGER NOT NULL CHECK (zeroed IN (0, 1)),
  rh_percent                   REAL,
  temperature_c                REAL,
  process                      TEXT CHECK (process IS NULL OR json_valid(process)),
  note                         TEXT NOT NULL DEFAULT '',
  -- the meter's settings when the reading arrived (a later re-calibration must not rewrite history)
  meter_calibrated_distance_m  REAL,
  meter_calibration_due        TEXT NOT NULL,
  -- revisions
  supersedes_id                TEXT REFERENCES readings (id),
  correction_reason            TEXT,
  content_hash                 TEXT NOT NULL,      -- canonical JSON of the input: an identical retry is a duplicate
  -- derived cache for indexes (recomputed by core/ on read; stamped with its version)
  field_v_per_m                REAL NOT NULL,
  derive_version               INTEGER NOT NULL,
  flags                        TEXT NOT NULL DEFAULT '[]' CHECK (json_valid(flags)),
  CHECK ((supersedes_id IS NULL) = (correction_reason IS NULL))
) STRICT;
-- Per-spot time series and weekly review: covering, so year-scale scans never touch the table.
CREATE INDEX readings_spot_time ON readings (spot_id, taken_at, field_v_per_m);
CREATE INDEX readings_round ON readings (round_id);
-- At most one correction per revision: history stays a line, never a tree.
CREATE UNIQUE INDEX readings_supersedes ON readings (supersedes_id) WHERE supersedes_id IS NOT NULL;

CREATE TABLE reading_tombstones (
  reading_id  TEXT PRIMARY KEY REFERENCES readings (id),
  reason      TEXT NOT NULL,
  at          TEXT NOT NULL
) STRICT;

-- A resent reading whose content differs from the stored one: kept for review, never applied.
CREATE TABLE reading_conflicts (
  id            TEXT PRIMARY KEY,
  reading_id    TEXT NOT NULL REFERENCES readings (id),
  payload       TEXT NOT NULL CHECK (json_valid(payload)),
  content_hash  TEXT NOT NULL,
  received_at   TEXT NOT NULL,
  UNIQUE (reading_id, content_hash)
) STRICT;

CREATE TRIGGER readings_append_only_update BEFORE UPDATE ON readings
BEGIN SELECT RAISE(ABORT, 'readings are append-only: post a correction instead'); END;
CREATE TRIGGER readings_append_only_delete BEFORE DELETE ON readings
BEGIN SELECT RAISE(ABORT, 'readings are append-only: post a tombstone instead'); END;
CREATE TRIGGER reading_tombstones_append_only_update BEFORE UPDATE ON reading_tombstones
BEGIN SELECT RAISE(ABORT, 'tombstones are append-only'); END;
CREATE TRIGGER reading_tombstones_append_only_delete BEFORE DELETE ON reading_tombstones
BEGIN SELECT RAISE(ABORT, 'tombstones are append-only'); END;
