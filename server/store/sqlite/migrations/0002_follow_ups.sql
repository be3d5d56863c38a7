-- 0002_follow_ups: corrective actions opened from a hot spot, and their history.
--
-- A follow-up is open until it is closed either by a verifying reading (a current
-- reading of the same spot, taken after the follow-up was opened, within limits)
-- or by a written reason. Reopening clears the closing fields; the history of
-- every change is kept in follow_up_events, which is append-only.

CREATE TABLE follow_ups (
  id                      TEXT PRIMARY KEY,
  site_id                 TEXT NOT NULL REFERENCES sites (id),
  spot_id                 TEXT NOT NULL REFERENCES spots (id),
  opened_from_reading_id  TEXT REFERENCES readings (id),
  finding_class           TEXT NOT NULL CHECK (finding_class IN ('observation', 'minor-nonconformance', 'major-nonconformance')),
  action                  TEXT NOT NULL,
  assignee                TEXT NOT NULL DEFAULT '',
  due_date                TEXT,                  -- YYYY-MM-DD, the site's calendar
  status                  TEXT NOT NULL CHECK (status IN ('open', 'closed')),
  opened_by               TEXT NOT NULL DEFAULT '',
  closed_at               TEXT,
  closed_by_reading_id    TEXT REFERENCES readings (id),
  closed_reason           TEXT,
  closed_by               TEXT,
  created_at              TEXT NOT NULL,
  updated_at              TEXT NOT NULL,
  CHECK ((status = 'open') = (closed_at IS NULL)),
  CHECK (status = 'open' OR ((closed_by_reading_id IS NULL) <> (closed_reason IS NULL))),
  CHECK (status = 'closed' OR (closed_by_reading_id IS NULL AND closed_reason IS NULL AND closed_by IS NULL))
) STRICT;
CREATE INDEX follow_ups_spot ON follow_ups (spot_id, status);
CREATE INDEX follow_ups_site_status ON follow_ups (site_id, status, due_date);

CREATE TABLE follow_up_events (
  id            TEXT PRIMARY KEY,
  follow_up_id  TEXT NOT NULL REFERENCES follow_ups (id),
  kind          TEXT NOT NULL CHECK (kind IN ('opened', 'edited', 'closed', 'reopened')),
  at            TEXT NOT NULL,
  by            TEXT NOT NULL DEFAULT '',
  reading_id    TEXT REFERENCES readings (id),
  reason        TEXT,
  -- what changed: { field: { from, to } } for edits; the verifying reading's verdict for closes
  detail        TEXT NOT NULL DEFAULT '{}' CHECK (json_valid(detail))
) STRICT;
CREATE INDEX follow_up_events_follow_up ON follow_up_events (follow_up_id, at);

CREATE TRIGGER follow_up_events_append_only_update BEFORE UPDATE ON follow_up_events
BEGIN SELECT RAISE(ABORT, 'follow-up history is append-only'); END;
CREATE TRIGGER follow_up_events_append_only_delete BEFORE DELETE ON follow_up_events
BEGIN SELECT RAISE(ABORT, 'follow-up history is append-only'); END;
