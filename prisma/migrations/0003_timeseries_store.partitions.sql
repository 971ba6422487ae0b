-- Plain PostgreSQL flavour: native range partitions, one per calendar month
-- (UTC), named <table>_pYYYY_MM. Partitions are created ahead by the
-- maintenance job and on demand by the ingest writer for late (backlog) data;
-- retention drops whole partitions whose month ended before the cut-off.

-- Create the monthly partitions of p_table covering [p_from, p_to].
-- Returns how many were created. Safe to call concurrently and repeatedly.
CREATE FUNCTION holdfast_ensure_partitions(p_table text, p_from timestamptz, p_to timestamptz)
RETURNS integer LANGUAGE plpgsql AS $$
DECLARE
  -- Month arithmetic on UTC wall-clock timestamps, so the session time zone
  -- (and its DST changes) cannot shift a boundary.
  m        timestamp := date_trunc('month', p_from AT TIME ZONE 'UTC');
  last_m   timestamp := date_trunc('month', p_to AT TIME ZONE 'UTC');
  created  integer := 0;
  part     text;
BEGIN
  IF p_table NOT IN (SELECT table_name FROM holdfast_retention) THEN
    RAISE EXCEPTION 'holdfast_ensure_partitions: % is not a time-series table', p_table;
  END IF;
  WHILE m <= last_m LOOP
    part := format('%s_p%s', p_table, to_char(m, 'YYYY_MM'));
    IF to_regclass(part) IS NULL THEN
      -- Two writers may race here; the loser's duplicate is harmless.
      BEGIN
        EXECUTE format('CREATE TABLE %I PARTITION OF %I FOR VALUES FROM (%L) TO (%L)',
                       part, p_table, m AT TIME ZONE 'UTC', (m + interval '1 month') AT TIME ZONE 'UTC');
        created := created + 1;
      EXCEPTION WHEN duplicate_table THEN
        NULL;
      END;
    END IF;
    m := m + interval '1 month';
  END LOOP;
  RETURN created;
END $$;

-- Drop partitions of every time-series table whose whole month is older than
-- that table's retention. Returns the dropped partition names.
CREATE FUNCTION holdfast_apply_retention(p_now timestamptz DEFAULT now())
RETURNS SETOF text LANGUAGE plpgsql AS $$
DECLARE
  r record;
BEGIN
  FOR r IN
    SELECT c.relname AS part
      FROM holdfast_retention k
      JOIN pg_inherits i ON i.inhparent = k.table_name::regclass
      JOIN pg_class c ON c.oid = i.inhrelid
     WHERE c.relname ~ '_p[0-9]{4}_[0-9]{2}$'
       AND (to_date(right(c.relname, 7), 'YYYY_MM')::timestamp + interval '1 month') AT TIME ZONE 'UTC'
           <= p_now - k.keep
  LOOP
    EXECUTE format('DROP TABLE %I', r.part);
    RETURN NEXT r.part;
  END LOOP;
END $$;

-- Partitions for the months around installation, so the first records land.
SELECT holdfast_ensure_partitions(table_name, now() - interval '1 month', now() + interval '3 months')
  FROM holdfast_retention;
