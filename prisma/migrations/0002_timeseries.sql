-- Time-series tables for the five streams of telemetry-v1.
--
-- The primary keys are the contract's idempotency keys, so a duplicate record
-- cannot be stored twice: (vessel, t) and, for per-unit streams, the unit id.
-- `t` is the start of the interval. Optional contract fields are nullable
-- (missing is NULL, never 0).
--
-- The token @PARTITION_BY_TIME@ is replaced by the migration runner:
--   partitions flavour -> PARTITION BY RANGE (t)   (monthly partitions, 0003)
--   timescale flavour  -> nothing                  (hypertables, 0003)
-- vessel_id deliberately has no foreign key: the ingest worker checks the
-- register before writing and a key check per row would slow bulk loads.

CREATE TABLE ts_station (
  vessel_id        integer NOT NULL,
  t                timestamptz NOT NULL,
  dt               smallint NOT NULL CHECK (dt BETWEEN 1 AND 3600),
  mode             text NOT NULL CHECK (mode IN ('auto_position', 'auto_track', 'joystick', 'manual', 'standby')),
  dp_s             real NOT NULL,
  n                integer NOT NULL,
  sp_lat           double precision,
  sp_lon           double precision,
  sp_hdg           real,
  err_north_mean   real,
  err_east_mean    real,
  err_r_mean       real,
  err_r_rms        real,
  err_r_max        real,
  err_hist         integer[],
  hdg_err_mean     real,
  hdg_err_rms      real,
  hdg_err_max_abs  real,
  wind_ms          real,
  wind_gust_ms     real,
  wind_from_deg    real,
  current_ms       real,
  current_to_deg   real,
  residual_kn      real,
  residual_to_deg  real,
  PRIMARY KEY (vessel_id, t)
) @PARTITION_BY_TIME@;

CREATE TABLE ts_thruster (
  vessel_id           integer NOT NULL,
  unit_id             text NOT NULL,
  t                   timestamptz NOT NULL,
  dt                  smallint NOT NULL CHECK (dt BETWEEN 1 AND 3600),
  run_s               real NOT NULL,
  starts              integer NOT NULL,
  rpm                 real,
  pitch_pct           real,
  load_pct_mean       real,
  load_pct_max        real,
  thrust_kn           real,
  power_kw            real,
  azimuth_deg         real,
  azimuth_travel_deg  real,
  load_band_s         real[],
  PRIMARY KEY (vessel_id, unit_id, t)
) @PARTITION_BY_TIME@;

CREATE TABLE ts_power (
  vessel_id     integer NOT NULL,
  unit_id       text NOT NULL,
  t             timestamptz NOT NULL,
  dt            smallint NOT NULL CHECK (dt BETWEEN 1 AND 3600),
  kw_mean       real,
  kw_max        real,
  kw_available  real,
  gens_online   integer,
  limit_s       real,
  limit_events  integer,
  blackout      boolean,
  PRIMARY KEY (vessel_id, unit_id, t)
) @PARTITION_BY_TIME@;

CREATE TABLE ts_ref (
  vessel_id  integer NOT NULL,
  unit_id    text NOT NULL,
  t          timestamptz NOT NULL,
  dt         smallint NOT NULL CHECK (dt BETWEEN 1 AND 3600),
  kind       text,
  online_s   real,
  weight     real,
  sd_m       real,
  rejected   integer,
  PRIMARY KEY (vessel_id, unit_id, t)
) @PARTITION_BY_TIME@;

CREATE TABLE ts_track (
  vessel_id  integer NOT NULL,
  t          timestamptz NOT NULL,
  lat        double precision NOT NULL,
  lon        double precision NOT NULL,
  hdg        real,
  sp_lat     double precision,
  sp_lon     double precision,
  sp_hdg     real,
  PRIMARY KEY (vessel_id, t)
) @PARTITION_BY_TIME@;

-- How long each table keeps its rows. Both store flavours read this table:
-- TimescaleDB as retention policies, plain PostgreSQL when the maintenance
-- job drops old monthly partitions. Raw track positions are kept shorter.
CREATE TABLE holdfast_retention (
  table_name  text PRIMARY KEY,
  keep        interval NOT NULL CHECK (keep > interval '0')
);
INSERT INTO holdfast_retention (table_name, keep) VALUES
  ('ts_station', interval '5 years'),
  ('ts_thruster', interval '5 years'),
  ('ts_power', interval '5 years'),
  ('ts_ref', interval '5 years'),
  ('ts_track', interval '90 days');
