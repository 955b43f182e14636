import type { ChannelWidthMHz } from '../enums';

/** Thermal noise density kT at 290 K, in dBm/Hz. */
export const THERMAL_NOISE_DBM_PER_HZ = -174;
export const DEFAULT_NOISE_FIGURE_DB = 5;

/** Modulation and coding of HT MCS0–7 (one spatial stream): coded bits per subcarrier and code rate. */
export const HT_MCS = [
  { mcs: 0, bitsPerSubcarrier: 1, codeRate: 1 / 2 },
  { mcs: 1, bitsPerSubcarrier: 2, codeRate: 1 / 2 },
  { mcs: 2, bitsPerSubcarrier: 2, codeRate: 3 / 4 },
  { mcs: 3, bitsPerSubcarrier: 4, codeRate: 1 / 2 },
  { mcs: 4, bitsPerSubcarrier: 4, codeRate: 3 / 4 },
  { mcs: 5, bitsPerSubcarrier: 6, codeRate: 2 / 3 },
  { mcs: 6, bitsPerSubcarrier: 6, codeRate: 3 / 4 },
  { mcs: 7, bitsPerSubcarrier: 6, codeRate: 5 / 6 },
] as const;

/**
 * Data subcarriers per width: 52 and 108 are HT (IEEE 802.11-2020 HT PHY); 80 MHz does not exist in HT,
 * so it takes the VHT figure 234 with the same MCS0–7 modulations (from memory, IEEE 802.11-2020 VHT PHY).
 */
export const DATA_SUBCARRIERS: Record<ChannelWidthMHz, number> = { 20: 52, 40: 108, 80: 234 };
export const SYMBOL_TIME_LONG_GI_US = 4.0;

const HT20_MIN_SENSITIVITY_DBM = [-82, -79, -77, -74, -70, -66, -65, -64];
/**
 * Minimum input sensitivity per MCS (IEEE 802.11-2020 receiver performance tables): 40 MHz is 3 dB worse
 * than 20 MHz, and 80 MHz another 3 dB worse than 40 MHz (twice the bandwidth, twice the noise).
 */
export const MIN_SENSITIVITY_DBM: Record<ChannelWidthMHz, readonly number[]> = {
  20: HT20_MIN_SENSITIVITY_DBM,
  40: HT20_MIN_SENSITIVITY_DBM.map((s) => s + 3),
  80: HT20_MIN_SENSITIVITY_DBM.map((s) => s + 6),
};

// PHY data rate, IEEE 802.11 HT: N_SD·N_BPSCS·R·N_SS / T_SYM (bits per µs = Mb/s).
export function phyRateMbps(
  dataSubcarriers: number,
  bitsPerSubcarrier: number,
  codeRate: number,
  spatialStreams = 1,
  symbolTimeUs = SYMBOL_TIME_LONG_GI_US,
): number {
  return (dataSubcarriers * bitsPerSubcarrier * codeRate * spatialStreams) / symbolTimeUs;
}

/** Single-stream long-GI rate of one MCS at a channel width. */
export function htRateMbps(mcs: number, channelWidthMHz: ChannelWidthMHz): number {
  const m = HT_MCS[mcs];
  if (!m) throw new RangeError('MCS must be 0–7');
  return phyRateMbps(DATA_SUBCARRIERS[channelWidthMHz], m.bitsPerSubcarrier, m.codeRate);
}

// EIRP = Ptx + Gtx − Ltx (dBm, dBi, dB).
export function eirpDbm(txPowerDbm: number, antennaGainDbi: number, cableLossDb: number): number {
  return txPowerDbm + antennaGainDbi - cableLossDb;
}

// Received power, the link budget: Prx = Ptx + Gtx − Ltx − L + Grx − Lrx.
export function rxSignalDbm(p: {
  txPowerDbm: number;
  txAntennaGainDbi: number;
  txCableLossDb: number;
  pathLossDb: number;
  rxAntennaGainDbi: number;
  rxCableLossDb: number;
}): number {
  return eirpDbm(p.txPowerDbm, p.txAntennaGainDbi, p.txCableLossDb) - p.pathLossDb + p.rxAntennaGainDbi - p.rxCableLossDb;
}

// Receiver noise floor: kT (−174 dBm/Hz at 290 K) + 10·log10(B Hz) + noise figure.
export function noiseFloorDbm(channelWidthMHz: number, noiseFigureDb = DEFAULT_NOISE_FIGURE_DB): number {
  return THERMAL_NOISE_DBM_PER_HZ + 10 * Math.log10(channelWidthMHz * 1e6) + noiseFigureDb;
}

/** Signal-to-noise ratio in dB: SNR = Prx − N. */
export function snrDb(signalDbm: number, noiseDbm: number): number {
  return signalDbm - noiseDbm;
}

// Shannon capacity C = B·log2(1 + SNR): the ceiling no modulation beats, for comparison with the PHY rate.
export function shannonCapacityMbps(channelWidthMHz: number, snr: number): number {
  return channelWidthMHz * Math.log2(1 + 10 ** (snr / 10));
}

/** Highest single-stream MCS whose minimum sensitivity the signal meets, or null when even MCS0 fails. */
export function bestMcs(signalDbm: number, channelWidthMHz: ChannelWidthMHz): number | null {
  const table = MIN_SENSITIVITY_DBM[channelWidthMHz];
  for (let mcs = table.length - 1; mcs >= 0; mcs--) if (table[mcs] <= signalDbm) return mcs;
  return null;
}

/** The rate a link should carry: highest MCS rate whose sensitivity ≤ signal, else 0. */
export function expectedRateMbps(signalDbm: number, channelWidthMHz: ChannelWidthMHz): number {
  const mcs = bestMcs(signalDbm, channelWidthMHz);
  return mcs === null ? 0 : htRateMbps(mcs, channelWidthMHz);
}

/** Fade margin: how far the signal may drop before even MCS0 is lost. */
export function fadeMarginDb(signalDbm: number, channelWidthMHz: ChannelWidthMHz): number {
  return signalDbm - MIN_SENSITIVITY_DBM[channelWidthMHz][0];
}
