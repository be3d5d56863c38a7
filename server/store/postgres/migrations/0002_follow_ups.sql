-- 0002_follow_ups (PostgreSQL): corrective actions opened from a hot spot, and their history.
-- Same as server/store/sqlite/migrations/0002_follow_ups.sql; follow_up_events has
-- `seq` (insertion order, SQLite's rowid) and its column "by" is quoted (a keyword here).

CREATE TABLE follow_ups (
  id                      TEXT COLLATE "C" PRIMARY KEY,
  site_id                 TEXT COLLATE "C" NOT NULL REFERENCES sites (id),
  spot_id                 TEXT COLLATE "C" NOT NULL REFERENCES spots (id),
  opened_from_reading_id  TEXT COLLATE "C" REFERENCES readings (id),
  finding_class           TEXT COLLATE "C" NOT NULL CHECK (finding_class IN ('observation', 'minor-nonconformance', 'major-nonconformance')),
  action                  TEXT COLLATE "C" NOT NULL,
  assignee                TEXT COLLATE "C" NOT NULL DEFAULT '',
  due_date                TEXT COLLATE "C",                  -- YYYY-MM-DD, the site's calendar
  status                  TEXT COLLATE "C" NOT NULL CHECK (status IN ('open', 'closed')),
  opened_by               TEXT COLLATE "C" NOT NULL DEFAULT '',
  closed_at               TEXT COLLATE "C",
  closed_by_reading_id    TEXT COLLATE "C" REFERENCES readings (id),
  closed_reason           TEXT COLLATE "C",
  closed_by               TEXT COLLATE "C",
  created_at              TEXT COLLATE "C" NOT NULL,
  updated_at              TEXT COLLATE "C" NOT NULL,
  CHECK ((status = 'open') = (closed_at IS NULL)),
  CHECK (status = 'open' OR ((closed_by_reading_id IS NULL) <> (closed_reason IS NULL))),
  CHECK (status = 'closed' OR (closed_by_reading_id IS NULL AND closed_reason IS NULL AND closed_by IS NULL))
);
CREATE INDEX follow_ups_spot ON follow_ups (spot_id, status);
CREATE INDEX follow_ups_site_status ON follow_ups (site_id, status, due_date);

CREATE TABLE follow_up_events (
  id            TEXT COLLATE "C" PRIMARY KEY,
  seq           BIGINT GENERATED ALWAYS AS IDENTITY UNIQUE,
  follow_up_id  TEXT COLLATE "C" NOT NULL REFERENCES follow_ups (id),
  kind          TEXT COLLATE "C" NOT NULL CHECK (kind IN ('opened', 'edited', 'closed', 'reopened')),
  at            TEXT COLLATE "C" NOT NULL,
  "by"          TEXT COLLATE "C" NOT NULL DEFAULT '',
  reading_id    TEXT COLLATE "C" REFERENCES readings (id),
  reason        TEXT COLLATE "C",
  -- what changed: { field: { from, to } } for edits; the verifying reading's verdict for closes
  detail        JSON NOT NULL DEFAULT '{}'
);
CREATE INDEX follow_up_events_follow_up ON follow_up_events (follow_up_id, at);

CREATE TRIGGER follow_up_events_append_only_update BEFORE UPDATE ON follow_up_events
  FOR EACH ROW EXECUTE FUNCTION chargewalk_append_only('follow-up history is append-only');
CREATE TRIGGER follow_up_events_append_only_delete BEFORE DELETE ON follow_up_events
  FOR EACH ROW EXECUTE FUNCTION chargewalk_append_only('follow-up history is append-only');
CREATE TRIGGER follow_up_events_append_only_truncate BEFORE TRUNCATE ON follow_up_events
  FOR EACH STATEMENT EXECUTE FUNCTION chargewalk_append_only('follow-up history is append-only');
