-- The wind's beam share of the day (docs/flags.md "Weather"): the mean, over
-- DP intervals weighted by dt, of |sin(wind from − heading set point)|, 0 for
-- wind on the bow or stern and 1 for wind on the beam. Heading RMS follows it
-- more than the wind speed: the flag job's weather adjustment of heading RMS
-- uses both. NULL when no DP interval of the day has wind direction and a
-- heading set point.
ALTER TABLE daily_vessel ADD COLUMN wind_beam_share double precision
  CHECK (wind_beam_share BETWEEN 0 AND 1);
