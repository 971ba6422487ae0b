-- Trend flags (metrics-v1 "Trend flags"): written by the flag job, worked
-- through by shore engineers. Lifecycle: open → acknowledged → closed.
CREATE TABLE flag (
  id               bigserial PRIMARY KEY,
  vessel_id        integer NOT NULL REFERENCES vessel (id) ON DELETE CASCADE,
  -- 'vessel', 'thruster:ID' or 'ref:ID' (api-v1).
  subject          text NOT NULL CHECK (subject ~ '^(vessel|thruster:[A-Za-z0-9_-]{1,16}|ref:[A-Za-z0-9_-]{1,16})$'),
  metric           text NOT NULL,
  method           text NOT NULL,
  severity         text NOT NULL CHECK (severity IN ('advisory', 'warning', 'alarm')),
  opened_day       date NOT NULL,
  window_from      date NOT NULL,
  window_to        date NOT NULL,
  -- The value of the statistic that triggered the flag, and what it is.
  statistic        double precision NOT NULL,
  statistic_name   text NOT NULL,
  explanation      text NOT NULL,
  status           text NOT NULL DEFAULT 'open' CHECK (status IN ('open', 'acknowledged', 'closed')),
  acknowledged_by  text,
  acknowledged_at  timestamptz,
  acknowledge_note text,
  closed_by        text,
  closed_at        timestamptz,
  close_reason     text CHECK (close_reason IN ('resolved', 'dismissed')),
  close_note       text,
  -- Consecutive evaluated days on which the condition no longer held.
  clear_days       integer NOT NULL DEFAULT 0,
  last_evaluated_day date NOT NULL,
  created_at       timestamptz NOT NULL DEFAULT now(),
  updated_at       timestamptz NOT NULL DEFAULT now(),
  CHECK (window_from <= window_to),
  CHECK (status <> 'closed' OR close_reason IS NOT NULL)
);

-- One flag that is not closed per (vessel, subject, metric), however often the job re-runs.
CREATE UNIQUE INDEX flag_one_live_idx ON flag (vessel_id, subject, metric) WHERE status <> 'closed';
CREATE INDEX flag_status_idx ON flag (status, opened_day DESC);
