/**
 * One collator for the pages' sorting: names in English order, unit ids in
 * natural order (T2 before T10). Made once: `localeCompare` with a locale
 * argument builds a new collator on every call, which made sorting 500
 * vessels cost more than reading them.
 */
const names = new Intl.Collator('en');
const natural = new Intl.Collator('en', { numeric: true });

export const compareNames = (a: string, b: string): number => names.compare(a, b);
export const compareNatural = (a: string, b: string): number => natural.compare(a, b);
