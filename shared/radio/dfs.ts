// Dynamic frequency selection: where radar detection applies and how long a radio stays off the air.
// EU: ETSI EN 301 893 (channel availability check 60 s, 10 min in 5600–5650 MHz; 30 min non-occupancy).
// US: 47 CFR §15.407(h) with the test figures of FCC KDB 905462 (60 s check, 30 min non-occupancy; from memory).

export interface DfsGuidance {
  /** Seconds a radio listens for radar before it may transmit on the channel. */
  channelAvailabilityCheckS: number;
  /** Minutes a channel stays off limits after radar was detected on it. */
  nonOccupancyMin: number;
  advice: string;
}

const DFS_BANDS_MHZ: [number, number][] = [
  [5250, 5350],
  [5470, 5725],
];
/** Weather-radar sub-band with the longer check in the EU (ETSI EN 301 893). */
const EU_WEATHER_RADAR_MHZ: [number, number] = [5600, 5650];

const overlaps = (lo: number, hi: number, [a, b]: [number, number]) => lo < b && hi > a;

/** DFS rules for the spectrum [lo, hi] MHz in a region, or null when no part of it needs radar detection. */
export function dfsGuidance(region: 'US' | 'EU', loMHz: number, hiMHz: number): DfsGuidance | null {
  if (!DFS_BANDS_MHZ.some((b) => overlaps(loMHz, hiMHz, b))) return null;
  const weather = region === 'EU' && overlaps(loMHz, hiMHz, EU_WEATHER_RADAR_MHZ);
  const channelAvailabilityCheckS = weather ? 600 : 60;
  const nonOccupancyMin = 30;
  const advice =
    `DFS: the radio must listen ${weather ? '10 minutes (5600–5650 MHz weather radar)' : '60 s'} before transmitting and, after detecting radar, ` +
    `leave the channel for ${nonOccupancyMin} minutes; for backhaul prefer a channel without DFS so a radar pulse does not take the link down.`;
  return { channelAvailabilityCheckS, nonOccupancyMin, advice };
}
