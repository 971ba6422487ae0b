-- The daily figures of metrics-v1, written by the daily job (lib/jobs/) and
-- read by the API and the web app. Derived data: every row can be rebuilt
-- from the time-series tables, and re-running a day gives the same row.
-- `day` is the fleet-time-zone calendar day (FLEET_TIME_ZONE). A figure that
-- cannot be computed is NULL, never 0.

-- The session-1 roll-up held only dp_hours and a record count. Replace it and
-- mark every day it covered dirty, so the job recomputes them in full.
INSERT INTO dirty_day (vessel_id, day)
  SELECT vessel_id, day FROM daily_vessel
  ON CONFLICT (vessel_id, day) DO NOTHING;
DROP TABLE daily_vessel;

-- Per vessel and day: station-keeping accuracy (DP intervals only),
-- environment of the day, and the power limit summed over the vessel's buses.
-- A row exists for a vessel-day that received any telemetry.
CREATE TABLE daily_vessel (
  vessel_id                integer NOT NULL REFERENCES vessel (id) ON DELETE CASCADE,
  day                      date NOT NULL,
  station_records          integer NOT NULL,
  dp_intervals             integer NOT NULL,
  -- NULL when no station record of the day arrived (no data is not 0 h).
  dp_hours                 double precision,
  -- N, and the element-wise sum of the DP intervals' err.hist (101 bins, the
  -- last one ≥ 10 m): kept so campaign and range figures merge exactly.
  samples                  bigint NOT NULL,
  err_hist                 bigint[],
  p50_m                    double precision,
  p95_m                    double precision,
  p99_m                    double precision,
  -- Percentiles that fell in the overflow bin are reported as 10 ("≥ 10 m").
  p95_overflow             boolean,
  r_rms_m                  double precision,
  r_max_m                  double precision,
  -- {"3": 97.2, "5": 99.8}: keys are the vessel's watch circles as written
  -- in the fleet register.
  within_pct               jsonb NOT NULL DEFAULT '{}',
  hdg_rms_deg              double precision,
  hdg_max_abs_deg          double precision,
  wind_mean_ms             double precision,
  gust_max_ms              double precision,
  current_mean_ms          double precision,
  -- p95 as a ratio to what the vessel's weather fit expects (lib/metrics/normalisedAccuracy.ts).
  p95_norm                 double precision,
  limit_events             integer,
  limit_seconds            double precision,
  limit_events_per_dp_day  double precision,
  blackouts                integer,
  peak_load_ratio          double precision,
  computed_at              timestamptz NOT NULL DEFAULT now(),
  PRIMARY KEY (vessel_id, day)
);

-- Per thruster and day. unit_id is the id the telemetry sent.
CREATE TABLE daily_thruster (
  vessel_id           integer NOT NULL REFERENCES vessel (id) ON DELETE CASCADE,
  unit_id             text NOT NULL,
  day                 date NOT NULL,
  run_hours           double precision NOT NULL,
  starts              integer NOT NULL,
  azimuth_travel_deg  double precision,
  -- Load-weighted equivalent hours at rated load (ISO 281 life exponent,
  -- Palmgren–Miner sum); NULL when it ran and no interval sent load bands.
  wear_hours          double precision,
  -- Running seconds of intervals that sent no load bands (not in wear_hours).
  unbanded_run_s      double precision NOT NULL,
  efficiency_index    double precision,
  computed_at         timestamptz NOT NULL DEFAULT now(),
  PRIMARY KEY (vessel_id, unit_id, day)
);

-- Per switchboard section and day (every interval, whatever the DP mode).
CREATE TABLE daily_bus (
  vessel_id        integer NOT NULL REFERENCES vessel (id) ON DELETE CASCADE,
  unit_id          text NOT NULL,
  day              date NOT NULL,
  limit_events     integer,
  limit_seconds    double precision,
  blackouts        integer,
  peak_load_ratio  double precision,
  computed_at      timestamptz NOT NULL DEFAULT now(),
  PRIMARY KEY (vessel_id, unit_id, day)
);

-- Per position reference system and day.
CREATE TABLE daily_ref (
  vessel_id     integer NOT NULL REFERENCES vessel (id) ON DELETE CASCADE,
  unit_id       text NOT NULL,
  day           date NOT NULL,
  kind          text,
  online_hours  double precision,
  weight_mean   double precision,
  sd_m_median   double precision,
  rejections    integer,
  computed_at   timestamptz NOT NULL DEFAULT now(),
  PRIMARY KEY (vessel_id, unit_id, day)
);

CREATE INDEX daily_vessel_day_idx ON daily_vessel (day);
