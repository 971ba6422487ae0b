-- Fleet register (fleet-v1) and the accounts that later issues fill in.
-- Relational tables: read and written through the Prisma client
-- (prisma/schema.prisma mirrors them; test/schemaMatch.test.ts proves it).

CREATE TABLE organisation (
  id          serial PRIMARY KEY,
  key         text NOT NULL UNIQUE,
  name        text NOT NULL,
  created_at  timestamptz NOT NULL DEFAULT now()
);

CREATE TABLE app_user (
  id               serial PRIMARY KEY,
  email            text NOT NULL UNIQUE,
  display_name     text NOT NULL,
  role             text NOT NULL CHECK (role IN ('admin', 'fleet_manager', 'shore_engineer', 'charterer')),
  organisation_id  integer REFERENCES organisation (id) ON DELETE RESTRICT,
  created_at       timestamptz NOT NULL DEFAULT now()
);

CREATE TABLE vessel (
  id                  serial PRIMARY KEY,
  key                 text NOT NULL UNIQUE CHECK (key ~ '^[a-z0-9][a-z0-9-]{1,31}$'),
  name                text NOT NULL,
  type                text NOT NULL,
  dp_class            smallint NOT NULL CHECK (dp_class BETWEEN 1 AND 3),
  watch_circles_m     double precision[] NOT NULL,
  heading_limits_deg  double precision[] NOT NULL,
  created_at          timestamptz NOT NULL DEFAULT now(),
  updated_at          timestamptz NOT NULL DEFAULT now()
);

CREATE TABLE thruster (
  id                  serial PRIMARY KEY,
  vessel_id           integer NOT NULL REFERENCES vessel (id) ON DELETE CASCADE,
  unit_id             text NOT NULL CHECK (unit_id ~ '^[A-Za-z0-9_-]{1,16}$'),
  kind                text NOT NULL CHECK (kind IN ('tunnel', 'azimuth', 'main', 'retractable', 'other')),
  rated_kw            double precision NOT NULL CHECK (rated_kw > 0),
  diameter_m          double precision CHECK (diameter_m > 0),
  life_exponent       double precision NOT NULL DEFAULT 3 CHECK (life_exponent > 0),
  service_interval_h  double precision NOT NULL CHECK (service_interval_h > 0),
  wear_h_at_install   double precision NOT NULL DEFAULT 0 CHECK (wear_h_at_install >= 0),
  UNIQUE (vessel_id, unit_id)
);

CREATE TABLE bus (
  id         serial PRIMARY KEY,
  vessel_id  integer NOT NULL REFERENCES vessel (id) ON DELETE CASCADE,
  unit_id    text NOT NULL CHECK (unit_id ~ '^[A-Za-z0-9_-]{1,16}$'),
  rated_kw   double precision NOT NULL CHECK (rated_kw > 0),
  UNIQUE (vessel_id, unit_id)
);

CREATE TABLE ref_system (
  id         serial PRIMARY KEY,
  vessel_id  integer NOT NULL REFERENCES vessel (id) ON DELETE CASCADE,
  unit_id    text NOT NULL CHECK (unit_id ~ '^[A-Za-z0-9_-]{1,16}$'),
  kind       text NOT NULL CHECK (kind IN ('gnss', 'hydroacoustic', 'laser', 'radar', 'taut_wire', 'other')),
  UNIQUE (vessel_id, unit_id)
);

CREATE TABLE campaign (
  id               serial PRIMARY KEY,
  key              text NOT NULL UNIQUE,
  charterer        text NOT NULL,
  organisation_id  integer REFERENCES organisation (id) ON DELETE SET NULL,
  from_day         date NOT NULL,
  to_day           date NOT NULL,
  site_name        text NOT NULL,
  site_lat         double precision NOT NULL CHECK (site_lat BETWEEN -90 AND 90),
  site_lon         double precision NOT NULL CHECK (site_lon BETWEEN -180 AND 180),
  watch_circles_m  double precision[] NOT NULL,
  CHECK (from_day <= to_day)
);

CREATE TABLE campaign_vessel (
  campaign_id  integer NOT NULL REFERENCES campaign (id) ON DELETE CASCADE,
  vessel_id    integer NOT NULL REFERENCES vessel (id) ON DELETE CASCADE,
  PRIMARY KEY (campaign_id, vessel_id)
);
