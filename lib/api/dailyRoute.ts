import type { Queryable } from './context';
import { notFound } from './errors';
import { flattenRecords } from './flatten';
import { parseDayRange, parseFormat, type DayRange } from './params';
import { renderList } from './render';
import { apiRoute } from './route';
import { columnsOf, type SchemaName } from './schemas';
import { requireVessel, visibleDayRows } from './scoped';

/**
 * The three `/vessels/{key}/…/daily?from&to` endpoints have one shape:
 * parse the range and format, read the vessel's rows, 404 for an unknown
 * key, answer `{vessel, days}` or its rows as CSV. A vessel outside the
 * caller's scope is unknown (404), and only its visible days are returned.
 */
export interface VesselDays {
  vessel: string;
  days: { day: string }[];
  /** within_pct keys of the limits configured now (CSV columns even when no day has them). */
  limitKeys?: string[];
}

export function vesselDailyRoute(options: {
  query: (db: Queryable, key: string, range: DayRange) => Promise<VesselDays | null>;
  /** The schema of one item of `days`: its properties are the CSV columns. */
  item: SchemaName;
  /** File name part: kelvick-skua-{name}-2026-01-01-2026-01-30.csv */
  name: string;
}) {
  return apiRoute<{ key: string }>(async ({ search, params, ctx, scope }) => {
    const range = parseDayRange(search, ctx.today());
    const format = parseFormat(search);
    requireVessel(scope, params.key);
    const found = await options.query(ctx.db, params.key, range);
    if (!found) throw notFound('vessel', params.key);
    const result = { ...found, days: visibleDayRows(scope, found.vessel, found.days) };
    return renderList(
      format,
      () => ({ vessel: result.vessel, days: result.days }),
      () => ({
        table: flattenRecords(result.days, columnsOf(options.item), result.limitKeys ? { within_pct: result.limitKeys } : {}),
        fileName: `${result.vessel}-${options.name}-${range.from}-${range.to}`,
      }),
    );
  });
}
