-- 0004_review_week_cache: kept weekly aggregates for the weekly review.
--
-- The review of a week compares it with the weeks before (change from the previous
-- week, trend over 8 weeks, the site's usual humidity over 13 weeks). Reading those
-- weeks' rows each time costs far more than the week itself, so each complete past
-- week is summarised once per site and time zone: per spot (median and largest
-- |field| of the current, not deleted revisions; median RH) and for the whole site.
-- A row is a cache: the store deletes a week's rows whenever a reading
-- taken in it is stored, corrected or deleted, and `version` stamps the computation
-- (rows of another version are ignored and recomputed).

CREATE TABLE review_week_cache (
  site_id            TEXT NOT NULL REFERENCES sites (id),
  start_ms           INTEGER NOT NULL,
  time_zone          TEXT NOT NULL,
  end_ms             INTEGER NOT NULL,
  readings           INTEGER NOT NULL,
  median_rh_percent  REAL,
  -- per spot: { "<spot id>": [readings, median |field| V/m, largest |field| V/m, median RH % or null] }
  -- (one JSON value per week reads far faster than a row per spot)
  spots              TEXT NOT NULL CHECK (json_valid(spots)),
  version            INTEGER NOT NULL,
  computed_at        TEXT NOT NULL,
  PRIMARY KEY (site_id, start_ms, time_zone)
) STRICT;
