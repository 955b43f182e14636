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
const DFS_NOTE = 'DFS: radar detection required before and during use';
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
    '5': [[range(36, 48, 4), INDOOR_NOTE], [range(52, 64, 4), `${INDOOR_NOTE}; ${DFS_NOTE}`], [range(100, 140, 4), DFS_NOTE]],
  },
  JP: {
    '2.4': [[range(1, 13, 1)], [[14], '802.11b only (DSSS/CCK), not OFDM']],
    // From memory: Japan's W52/W53/W56 blocks; channel 144 is left out until a source confirms it.
    '5': [[range(36, 48, 4), INDOOR_NOTE], [range(52, 64, 4), `${INDOOR_NOTE}; ${DFS_NOTE}`], [range(100, 140, 4), DFS_NOTE]],
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
