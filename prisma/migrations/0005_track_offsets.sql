-- North/east offsets (m) of each track position from its set point, computed
-- at ingest on the WGS84 ellipsoid (local tangent plane at the set point,
-- lib/geo/wgs84.ts); NULL when the record carries no set point. Stored so
-- that footprint plots read numbers instead of converting at query time.
ALTER TABLE ts_track ADD COLUMN north_m real, ADD COLUMN east_m real;
