-- TimescaleDB flavour: the time-series tables become hypertables, chunks are
-- compressed once they are a week old (segmented by vessel and unit, so a
-- vessel's history decompresses alone), and retention policies drop old
-- chunks. Raw `track` positions are kept for a shorter time than statistics.

SELECT create_hypertable('ts_station',  by_range('t', interval '7 days'));
SELECT create_hypertable('ts_thruster', by_range('t', interval '7 days'));
SELECT create_hypertable('ts_power',    by_range('t', interval '7 days'));
SELECT create_hypertable('ts_ref',      by_range('t', interval '7 days'));
SELECT create_hypertable('ts_track',    by_range('t', interval '1 day'));

ALTER TABLE ts_station  SET (timescaledb.compress, timescaledb.compress_segmentby = 'vessel_id',
                             timescaledb.compress_orderby = 't');
ALTER TABLE ts_thruster SET (timescaledb.compress, timescaledb.compress_segmentby = 'vessel_id, unit_id',
                             timescaledb.compress_orderby = 't');
ALTER TABLE ts_power    SET (timescaledb.compress, timescaledb.compress_segmentby = 'vessel_id, unit_id',
                             timescaledb.compress_orderby = 't');
ALTER TABLE ts_ref      SET (timescaledb.compress, timescaledb.compress_segmentby = 'vessel_id, unit_id',
                             timescaledb.compress_orderby = 't');
ALTER TABLE ts_track    SET (timescaledb.compress, timescaledb.compress_segmentby = 'vessel_id',
                             timescaledb.compress_orderby = 't');

SELECT add_compression_policy(table_name::regclass, interval '7 days') FROM holdfast_retention;
SELECT add_retention_policy(table_name::regclass, keep) FROM holdfast_retention;

-- Same interface as the partitions flavour, so callers need not ask which
-- store they talk to: TimescaleDB creates chunks itself and its retention
-- policies drop them, so both functions have nothing to do here.
CREATE FUNCTION holdfast_ensure_partitions(p_table text, p_from timestamptz, p_to timestamptz)
RETURNS integer LANGUAGE sql AS $$ SELECT 0 $$;

CREATE FUNCTION holdfast_apply_retention(p_now timestamptz DEFAULT now())
RETURNS SETOF text LANGUAGE sql AS $$ SELECT NULL::text WHERE false $$;
