-- 0003_floor_plans (PostgreSQL): one plan image per area, and where each spot sits on it.
-- Same as server/store/sqlite/migrations/0003_floor_plans.sql (BLOB is BYTEA here).

CREATE TABLE area_plans (
  area_id       TEXT COLLATE "C" PRIMARY KEY REFERENCES areas (id),
  content_type  TEXT COLLATE "C" NOT NULL CHECK (content_type IN ('image/png', 'image/jpeg', 'image/svg+xml')),
  bytes         BYTEA NOT NULL,
  width         INTEGER,
  height        INTEGER,
  sha256        TEXT COLLATE "C" NOT NULL,
  uploaded_at   TEXT COLLATE "C" NOT NULL
);

CREATE TABLE spot_positions (
  spot_id     TEXT COLLATE "C" PRIMARY KEY REFERENCES spots (id),
  area_id     TEXT COLLATE "C" NOT NULL REFERENCES areas (id),
  x           DOUBLE PRECISION NOT NULL CHECK (x >= 0 AND x <= 1),
  y           DOUBLE PRECISION NOT NULL CHECK (y >= 0 AND y <= 1),
  updated_at  TEXT COLLATE "C" NOT NULL
);
CREATE INDEX spot_positions_area ON spot_positions (area_id);
