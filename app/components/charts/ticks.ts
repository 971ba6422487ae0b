/** Axis ticks as people write them: no float noise such as 0.30000000000000004. */
export const tickNumber = (v: unknown): string => (typeof v === 'number' ? v.toLocaleString('en-GB', { maximumFractionDigits: 3 }) : String(v));
