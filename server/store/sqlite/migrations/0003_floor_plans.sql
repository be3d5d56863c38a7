-- 0003_floor_plans: one plan image per area, and where each spot sits on it.
--
-- The image is stored as uploaded after checks (PNG, JPEG) or sanitized (SVG); its
-- type was decided from its bytes. Positions are fractions 0..1 of the plan's width
-- and height (x from the left, y from the top), kept in their own table so spots
-- stay as they are; a position belongs to the area it was placed in, so a spot moved
-- to another area is unplaced there until someone places it again.

CREATE TABLE area_plans (
  area_id       TEXT PRIMARY KEY REFERENCES areas (id),
  content_type  TEXT NOT NULL CHECK (content_type IN ('image/png', 'image/jpeg', 'image/svg+xml')),
  bytes         BLOB NOT NULL,
  width         INTEGER,
  height        INTEGER,
  sha256        TEXT NOT NULL,
  uploaded_at   TEXT NOT NULL
) STRICT;

CREATE TABLE spot_positions (
  spot_id     TEXT PRIMARY KEY REFERENCES spots (id),
  area_id     TEXT NOT NULL REFERENCES areas (id),
  x           REAL NOT NULL CHECK (x >= 0 AND x <= 1),
  y           REAL NOT NULL CHECK (y >= 0 AND y <= 1),
  updated_at  TEXT NOT NULL
) STRICT;
CREATE INDEX spot_positions_area ON spot_positions (area_id);
