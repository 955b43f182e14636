import type { ChannelWidthMHz } from '../enums';
import { phyRateMbps } from './linkBudget';

// IEEE 802.11-2020 clause 19 (HT, 20/40 MHz, MCS0–7 per stream) and clause 21 (VHT, 80 MHz, MCS0–9):
// rate = N_SD·N_BPSCS·R·N_SS / T_SYM with N_SD 52, 108, 234 and T_SYM 4.0 µs (long GI) or 3.6 µs (short GI).

export type GuardInterval = 'long' | 'short';
export type SpatialStreams = 1 | 2;

const MODULATIONS = [
  { modulation: 'BPSK', bits: 1, codeRate: 1 / 2, rate: '1/2' },
  { modulation: 'QPSK', bits: 2, codeRate: 1 / 2, rate: '1/2' },
  { modulation: 'QPSK', bits: 2, codeRate: 3 / 4, rate: '3/4' },
  { modulation: '16-QAM', bits: 4, codeRate: 1 / 2, rate: '1/2' },
  { modulation: '16-QAM', bits: 4, codeRate: 3 / 4, rate: '3/4' },
  { modulation: '64-QAM', bits: 6, codeRate: 2 / 3, rate: '2/3' },
  { modulation: '64-QAM', bits: 6, codeRate: 3 / 4, rate: '3/4' },
  { modulation: '64-QAM', bits: 6, codeRate: 5 / 6, rate: '5/6' },
  { modulation: '256-QAM', bits: 8, codeRate: 3 / 4, rate: '3/4' },
  { modulation: '256-QAM', bits: 8, codeRate: 5 / 6, rate: '5/6' },
] as const;

/**
 * Minimum input sensitivity at 20 MHz per modulation (IEEE 802.11-2020 HT and VHT receiver tables; MCS8–9 from memory):
 * each doubling of width is 3 dB worse (40 MHz = 20 + 3, 80 MHz = 40 + 3). The tables apply per modulation, whatever
 * the number of streams.
 */
const SENSITIVITY_20_DBM = [-82, -79, -77, -74, -70, -66, -65, -64, -59, -57];
const WIDTH_PENALTY_DB: Record<ChannelWidthMHz, number> = { 20: 0, 40: 3, 80: 6 };
const DATA_SUBCARRIERS: Record<ChannelWidthMHz, number> = { 20: 52, 40: 108, 80: 234 };
/**
 * The tables assume a receiver noise figure of 10 dB (and 5 dB implementation margin; from memory). A receiver
 * with a worse noise figure loses the difference; a better one is still held to the standard's minimum.
 */
export const SENSITIVITY_REFERENCE_NOISE_FIGURE_DB = 10;

export interface RateRow {
  /** HT numbering at 20/40 MHz (MCS8–15 for two streams), VHT MCS0–9 at 80 MHz. */
  mcs: number;
  phy: 'HT' | 'VHT';
  modulation: string;
  codeRate: string;
  streams: SpatialStreams;
  rateMbps: number;
  sensitivityDbm: number;
}

const round1 = (x: number) => Math.round(x * 10) / 10;

/** The rates a link may use at a width, stream count and guard interval, slowest first. */
export function rateTable(
  channelWidthMHz: ChannelWidthMHz,
  streams: SpatialStreams = 1,
  guardInterval: GuardInterval = 'long',
  noiseFigureDb = SENSITIVITY_REFERENCE_NOISE_FIGURE_DB,
): RateRow[] {
  const vht = channelWidthMHz === 80;
  const symbolUs = guardInterval === 'short' ? 3.6 : 4.0;
  const receiverPenalty = Math.max(0, noiseFigureDb - SENSITIVITY_REFERENCE_NOISE_FIGURE_DB);
  return MODULATIONS.slice(0, vht ? 10 : 8).map((m, i) => ({
    mcs: vht ? i : i + 8 * (streams - 1),
    phy: vht ? 'VHT' : 'HT',
    modulation: m.modulation,
    codeRate: m.rate,
    streams,
    // Published tables print one decimal (e.g. 72.2, 866.7); the answer does the same.
    rateMbps: round1(phyRateMbps(DATA_SUBCARRIERS[channelWidthMHz], m.bits, m.codeRate, streams, symbolUs)),
    sensitivityDbm: SENSITIVITY_20_DBM[i] + WIDTH_PENALTY_DB[channelWidthMHz] + receiverPenalty,
  }));
}

/** The fastest row whose sensitivity the signal meets, or null when even the slowest is lost. */
export function bestRate(signalDbm: number, table: RateRow[]): RateRow | null {
  for (let i = table.length - 1; i >= 0; i--) if (table[i].sensitivityDbm <= signalDbm) return table[i];
  return null;
}

/** Margin against the slowest rate at or above a target: how far the signal may fade before the target is lost. */
export function marginForTargetDb(signalDbm: number, table: RateRow[], targetRateMbps: number): { row: RateRow; marginDb: number } | null {
  const row = table.find((r) => r.rateMbps >= targetRateMbps);
  return row ? { row, marginDb: signalDbm - row.sensitivityDbm } : null;
}
