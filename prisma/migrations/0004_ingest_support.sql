-- What the ingest worker records besides telemetry rows.

-- (vessel, day) pairs whose daily figures must be recomputed because a record
-- of that day arrived (late data included). `day` is the fleet-time-zone
-- calendar day; the job runner deletes a mark once it has recomputed the day
-- from a state at least as new as `marked_at`.
CREATE TABLE dirty_day (
  vessel_id  integer NOT NULL REFERENCES vessel (id) ON DELETE CASCADE,
  day        date NOT NULL,
  marked_at  timestamptz NOT NULL DEFAULT now(),
  PRIMARY KEY (vessel_id, day)
);

-- Records that could not be stored, with the reason, so nothing is lost
-- silently. The payload is truncated to 64 KiB (documented in docs/telemetry.md).
CREATE TABLE quarantine (
  id           bigserial PRIMARY KEY,
  received_at  timestamptz NOT NULL DEFAULT now(),
  topic        text NOT NULL,
  vessel_key   text,
  stream       text,
  reason       text NOT NULL,
  detail       text NOT NULL,
  payload      text NOT NULL
);
CREATE INDEX quarantine_received_at_idx ON quarantine (received_at);

-- A minimal daily roll-up written by the scheduled job: DP hours and record
-- counts per vessel and fleet day. The full metric set of metrics-v1 builds
-- on this table.
CREATE TABLE daily_vessel (
  vessel_id         integer NOT NULL REFERENCES vessel (id) ON DELETE CASCADE,
  day               date NOT NULL,
  dp_hours          double precision NOT NULL,
  station_records   integer NOT NULL,
  computed_at       timestamptz NOT NULL DEFAULT now(),
  PRIMARY KEY (vessel_id, day)
);
