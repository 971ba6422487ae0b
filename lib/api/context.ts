import { loadConfig } from '../config';
import type { Pool } from '../db/pool';
import { getSharedPool } from '../db/sharedPool';
import { fleetDay } from '../time/fleetDay';

/** What a query needs from the database: one statement at a time. */
export type Queryable = Pick<Pool, 'query'>;

/** What every API request works with: the web app's pool and the fleet's calendar. */
export interface ApiContext {
  db: Queryable;
  timeZone: string;
  /** Today in the fleet time zone, read at each call (a server runs past midnight). */
  today(): string;
}

export function apiContext(): ApiContext {
  const timeZone = loadConfig().FLEET_TIME_ZONE;
  return { db: getSharedPool(), timeZone, today: () => fleetDay(new Date(), timeZone) };
}
