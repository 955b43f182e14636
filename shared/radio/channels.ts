import type { Band } from '../enums';
import { PlanningError } from './errors';

export const CHANNEL_REGIONS = ['US', 'EU', 'JP'] as const;
export type ChannelRegion = (typeof CHANNEL_REGIONS)[number];

export interface ChannelEntry {
  channel: number;
  centerMHz: number;
  note?: string;
}

/**
 * Width convention for overlap: an OFDM channel (802.11g/n/ac) occupies 20 MHz, an 802.11b (DSSS) one
 * 22 MHz (IEEE 802.11; common practice for the occupied width). Callers pass 22 for 802.11b.
 */
export const OFDM_CHANNEL_WIDTH_MHZ = 20;
export const DSSS_CHANNEL_WIDTH_MHZ = 22;

// IEEE 802.11 channel numbering: 2.4 GHz centre = 2407 + 5n (n = 1…13), channel 14 = 2484; 5 GHz centre = 5000 + 5n.
export function channelCenterMHz(band: Band, channel: number): number {
  if (!Number.isInteger(channel)) throw new RangeError('channel must be a whole number');
  if (band === '2.4') {
    if (channel === 14) return 2484;
    if (channel >= 1 && channel <= 13) return 2407 + 5 * channel;
    throw new RangeError('2.4 GHz channels are 1–14');
  }
  if (channel >= 1 && channel <= 200) return 5000 + 5 * channel;
  throw new RangeError('5 GHz channels are numbered 1–200');
}

const range = (from: number, to: number, step: number) => Array.from({ length: Math.floor((to - from) / step) + 1 }, (_, i) => from + i * step);
// DFS times: ETSI EN 301 893 (EU) and 47 CFR §15.407(h) (US); see dfs.ts.
const DFS_NOTE =
  'DFS: radar detection required before and during use (60 s check before transmitting, 30 min off after radar); prefer a channel without DFS for backhaul';
const DFS_WEATHER_NOTE = 'DFS with weather radar (5600–5650 MHz): 10 min check before transmitting, 30 min off after radar; avoid for backhaul';
const INDOOR_NOTE = 'indoor use only';

type Spec = [channels: number[], note?: string];
const TABLES: Record<ChannelRegion, Record<Band, Spec[]>> = {
  US: {
    '2.4': [[range(1, 11, 1)]],
    '5': [[range(36, 48, 4)], [range(52, 64, 4), DFS_NOTE], [range(100, 144, 4), DFS_NOTE], [range(149, 165, 4)]],
  },
  EU: {
    '2.4': [[range(1, 13, 1)]],
    // ECC/DEC/(04)08: 5150–5350 MHz indoors; 5470–5725 MHz ends at channel 140 for a 20 MHz channel.
    '5': [
      [range(36, 48, 4), INDOOR_NOTE],
      [range(52, 64, 4), `${INDOOR_NOTE}; ${DFS_NOTE}`],
      [range(100, 116, 4), DFS_NOTE],
      [range(120, 128, 4), DFS_WEATHER_NOTE],
      [range(132, 140, 4), DFS_NOTE],
    ],
  },
  JP: {
    '2.4': [[range(1, 13, 1)], [[14], '802.11b only (DSSS/CCK), not OFDM']],
    // From memory: Japan's W52/W53/W56 blocks; channel 144 is left out until a source confirms it.
    '5': [
      [range(36, 48, 4), INDOOR_NOTE],
      [range(52, 64, 4), `${INDOOR_NOTE}; ${DFS_NOTE}`],
      [range(100, 140, 4), DFS_NOTE],
    ],
  },
};

/** The channels allowed in a region and band, with their centre frequency and any condition. */
export function listChannels(region: string, band: string): { channels: ChannelEntry[] } {
  if (!(CHANNEL_REGIONS as readonly string[]).includes(region)) {
    throw new PlanningError(400, 'unknown_region', `Region "${region}" has no channel table; choose US, EU or JP.`);
  }
  if (band !== '2.4' && band !== '5') throw new PlanningError(400, 'unknown_band', `Band "${band}" is not a Wi-Fi band here; choose 2.4 or 5.`);
  const channels = TABLES[region as ChannelRegion][band].flatMap(([list, note]) =>
    list.map((channel) => ({ channel, centerMHz: channelCenterMHz(band, channel), ...(note ? { note } : {}) })),
  );
  return { channels };
}

export function allowedChannelNumbers(region: ChannelRegion, band: Band): number[] {
  return listChannels(region, band).channels.map((c) => c.channel);
}

/** Spectrum a channel occupies: [centre − width/2, centre + width/2]. */
export interface Span {
  centerMHz: number;
  widthMHz: number;
}

// Overlap of two channels = length of the intersection of their [f − w/2, f + w/2] intervals.
export function spanOverlapMHz(a: Span, b: Span): number {
  const lo = Math.max(a.centerMHz - a.widthMHz / 2, b.centerMHz - b.widthMHz / 2);
  const hi = Math.min(a.centerMHz + a.widthMHz / 2, b.centerMHz + b.widthMHz / 2);
  return Math.max(0, hi - lo);
}

/** Overlap in MHz of two channels of one band at one width (20 MHz OFDM by default, 22 for 802.11b). */
export function channelOverlapMHz(band: Band, channelA: number, channelB: number, widthMHz = OFDM_CHANNEL_WIDTH_MHZ): number {
  return spanOverlapMHz({ centerMHz: channelCenterMHz(band, channelA), widthMHz }, { centerMHz: channelCenterMHz(band, channelB), widthMHz });
}

/**
 * The block a primary channel occupies at 20/40/80 MHz. 5 GHz blocks follow IEEE 802.11's fixed bonding
 * (36+40, 36–48, …; 149+153, 149–161); on 2.4 GHz a 40 MHz channel takes the secondary above it up to
 * channel 7 and below it from 8 on (common practice); 2.4 GHz has no 80 MHz channel.
 */
export function occupiedSpan(band: Band, channel: number, widthMHz: 20 | 40 | 80): Span & { channels: number[] } {
  const center20 = channelCenterMHz(band, channel);
  if (widthMHz === 20) return { centerMHz: center20, widthMHz, channels: [channel] };
  if (band === '2.4') {
    if (widthMHz === 80) throw new RangeError('2.4 GHz has no 80 MHz channels');
    if (channel === 14) throw new RangeError('channel 14 cannot be bonded to 40 MHz');
    const up = channel <= 7;
    return { centerMHz: center20 + (up ? 10 : -10), widthMHz, channels: up ? [channel, channel + 4] : [channel - 4, channel] };
  }
  const base = channel >= 149 ? 149 : 36;
  const perBlock = widthMHz / 5; // channel numbers per block
  const offset = (((channel - base) % perBlock) + perBlock) % perBlock;
  const first = channel - offset;
  const channels = range(first, first + perBlock - 4, 4);
  return { centerMHz: channelCenterMHz(band, first) + widthMHz / 2 - 10, widthMHz, channels };
}

/** Every region with a channel table here; a stored radio is checked against all of them (its network's region may change). */
const ANY_REGION: readonly ChannelRegion[] = CHANNEL_REGIONS;

function blockFits(band: Band, channel: number, widthMHz: 20 | 40 | 80, allowed: Set<number>): boolean {
  if (band === '2.4' && (widthMHz === 80 || (widthMHz === 40 && channel === 14))) return false;
  try {
    return occupiedSpan(band, channel, widthMHz).channels.every((c) => allowed.has(c));
  } catch {
    return false;
  }
}

/**
 * Primary channels usable at a width: every 20 MHz channel of the block (IEEE 802.11 fixed bonding on 5 GHz)
 * must be allowed in the region. Without a region, the channels usable in any region listed here (US, EU, JP).
 * The one home of the rule: radio schemas, the planning forms and the channel plan all call it.
 */
export function validChannels(band: Band, widthMHz: 20 | 40 | 80, region?: ChannelRegion): number[] {
  const regions = region ? [region] : ANY_REGION;
  const out = new Set<number>();
  for (const r of regions) {
    const allowed = new Set(allowedChannelNumbers(r, band));
    for (const ch of allowed) if (blockFits(band, ch, widthMHz, allowed)) out.add(ch);
  }
  return [...out].sort((x, y) => x - y);
}

/** Ranges like "36–64, 100–144, 149–165" for a sorted list of channel numbers stepping by `step`. */
function describeRanges(list: number[], step: number): string {
  const parts: string[] = [];
  let start = list[0];
  for (let i = 1; i <= list.length; i++) {
    if (i === list.length || list[i] !== list[i - 1] + step) {
      parts.push(start === list[i - 1] ? String(start) : `${start}–${list[i - 1]}`);
      start = list[i];
    }
  }
  return parts.join(', ') + (step === 4 ? ' in steps of 4' : '');
}

export interface ChannelProblem {
  field: 'channel' | 'channelWidthMHz';
  /** Without the field's name, so the validator can prefix its path. */
  message: string;
}

/** Why a band/channel/width combination cannot be set on a radio, or null when it can. */
export function channelProblem(band: Band, channel: number, widthMHz: number, region?: ChannelRegion): ChannelProblem | null {
  if (band === '2.4' && widthMHz === 80) {
    return { field: 'channelWidthMHz', message: 'must be 20 or 40 on 2.4 GHz: the band has no 80 MHz channel' };
  }
  if (widthMHz !== 20 && widthMHz !== 40 && widthMHz !== 80) return { field: 'channelWidthMHz', message: 'must be one of 20, 40, 80' };
  if (band === '2.4' ? channel < 1 || channel > 14 : channel < 32) {
    return { field: 'channel', message: 'must be 1–14 on 2.4 GHz or 32 and above on 5 GHz' };
  }
  const ok = validChannels(band, widthMHz, region);
  if (ok.includes(channel)) return null;
  const where = region ? ` in ${region}` : '';
  if (widthMHz === 20 || !validChannels(band, 20, region).includes(channel)) {
    const list = validChannels(band, 20, region);
    return { field: 'channel', message: `must be a ${band} GHz channel on the IEEE 802.11 raster${where}: ${describeRanges(list, band === '5' ? 4 : 1)}` };
  }
  const block = band === '2.4' && channel === 14 ? 'channel 14 cannot be bonded' : `its ${widthMHz} MHz block runs outside the allowed channels${where}`;
  return { field: 'channel', message: `cannot be used at ${widthMHz} MHz (${block}); use one of ${describeRanges(ok, band === '5' ? 4 : 1)}` };
}
