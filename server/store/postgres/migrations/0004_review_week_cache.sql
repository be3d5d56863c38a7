-- 0004_review_week_cache (PostgreSQL): kept weekly aggregates for the weekly review.
-- Same as server/store/sqlite/migrations/0004_review_week_cache.sql: a cache the
-- store drops per week whenever a reading taken in it is stored, corrected or deleted.

CREATE TABLE review_week_cache (
  site_id            TEXT COLLATE "C" NOT NULL REFERENCES sites (id),
  start_ms           BIGINT NOT NULL,
  time_zone          TEXT COLLATE "C" NOT NULL,
  end_ms             BIGINT NOT NULL,
  readings           INTEGER NOT NULL,
  median_rh_percent  DOUBLE PRECISION,
  -- per spot: { "<spot id>": [readings, median |field| V/m, largest |field| V/m, median RH % or null] }
  spots              JSON NOT NULL,
  version            INTEGER NOT NULL,
  computed_at        TEXT COLLATE "C" NOT NULL,
  PRIMARY KEY (site_id, start_ms, time_zone)
);
