/** Invented operating positions for the demo fleet (open sea, invented fields). */
export interface DemoSite {
  lat: number;
  lon: number;
  heading: number;
}

const SITES: DemoSite[] = [
  { lat: 59.412, lon: 2.871, heading: 215 },
  { lat: 59.398, lon: 2.902, heading: 190 },
  { lat: 60.215, lon: 3.344, heading: 240 },
  { lat: 57.806, lon: 1.912, heading: 200 },
  { lat: 58.533, lon: 1.207, heading: 185 },
  { lat: 56.774, lon: 2.458, heading: 230 },
  { lat: 59.425, lon: 2.845, heading: 260 },
  { lat: 60.902, lon: 2.118, heading: 170 },
  { lat: 57.311, lon: 1.604, heading: 205 },
  { lat: 61.037, lon: 1.554, heading: 225 },
  { lat: 61.041, lon: 1.561, heading: 220 },
  { lat: 58.990, lon: 3.027, heading: 195 },
];

/** The demo site of the i-th vessel of the register (cycled for larger fleets). */
export function demoSite(index: number): DemoSite {
  return SITES[index % SITES.length]!;
}
