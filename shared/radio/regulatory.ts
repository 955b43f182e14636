import { PlanningError } from './errors';

export const REGULATORY_REGIONS = ['US', 'EU'] as const;
export type RegulatoryRegion = (typeof REGULATORY_REGIONS)[number];
export const LINK_TYPES = ['point-to-point', 'point-to-multipoint'] as const;
export type LinkType = (typeof LINK_TYPES)[number];

export interface RegulatoryInput {
  region: string;
  freqMHz: number;
  antennaGainDbi: number;
  txPowerDbm: number;
  cableLossDb: number;
  linkType: LinkType;
  /** EU 5 GHz only: transmit power control fitted (assumed, as on outdoor kit); without it limits are 3 dB lower. */
  tpc?: boolean;
}
export interface RegulatoryAnswer {
  maxTxPowerDbm: number;
  maxEirpDbm: number;
  eirpDbm: number;
  compliant: boolean;
  rule: string;
}

interface Band {
  loMHz: number;
  hiMHz: number;
  /** US: conducted-power limit from the radio's output; EU: EIRP limit. */
  limitDbm: (input: RegulatoryInput) => number;
  clause: (input: RegulatoryInput) => string;
}

const GUIDANCE = 'Guidance only: the local regulator decides.';
const fmt = (x: number) => x.toFixed(2);
// Answers carry 0.01 dB; the verdict compares the same rounded figures the person sees.
const round2 = (x: number) => Math.round(x * 100) / 100;
const above6 = (gainDbi: number) => Math.max(0, gainDbi - 6);

// 47 CFR §15.247(b)(3),(c)(1) and §15.407(a): US limits are on conducted power; gain above 6 dBi reduces it.
// A gain that is not 6 + 3n dBi on a 2.4 GHz point-to-point link is reduced proportionally, (G − 6)/3, not rounded.
const US_BANDS: Band[] = [
  {
    loMHz: 2400, hiMHz: 2483.5,
    limitDbm: (i) => 30 - (i.linkType === 'point-to-point' ? above6(i.antennaGainDbi) / 3 : above6(i.antennaGainDbi)),
    clause: (i) => i.linkType === 'point-to-point'
      ? '47 CFR §15.247(b)(3) and (c)(1)(i): on 2400–2483.5 MHz a fixed point-to-point link may use 1 W (30 dBm) conducted with antennas up to 6 dBi, less 1 dB for every 3 dB of gain above 6 dBi (applied in proportion, not rounded).'
      : '47 CFR §15.247(b)(3) and (b)(4): on 2400–2483.5 MHz 1 W (30 dBm) conducted with antennas up to 6 dBi, less 1 dB for every dB of gain above 6 dBi (36 dBm EIRP).',
  },
  {
    // Fixed point-to-point U-NII-1 may use up to 23 dBi with no reduction (§15.407(a)(1)(i); from memory).
    loMHz: 5150, hiMHz: 5250,
    limitDbm: (i) => 30 - Math.max(0, i.antennaGainDbi - (i.linkType === 'point-to-point' ? 23 : 6)),
    clause: (i) => i.linkType === 'point-to-point'
      ? '47 CFR §15.407(a)(1)(i): on U-NII-1 (5150–5250 MHz) an outdoor fixed point-to-point access point may use 1 W (30 dBm) conducted with antennas up to 23 dBi, less 1 dB per dB above 23 dBi.'
      : '47 CFR §15.407(a)(1)(i): on U-NII-1 (5150–5250 MHz) an outdoor access point may use 1 W (30 dBm) conducted with antennas up to 6 dBi, less 1 dB per dB above 6 dBi; EIRP above 30° elevation is capped at 125 mW.',
  },
  {
    loMHz: 5250, hiMHz: 5350,
    limitDbm: (i) => 24 - above6(i.antennaGainDbi),
    clause: () => '47 CFR §15.407(a)(2): on U-NII-2A (5250–5350 MHz) 250 mW (24 dBm) conducted with antennas up to 6 dBi, less 1 dB per dB above 6 dBi; DFS required.',
  },
  {
    loMHz: 5470, hiMHz: 5725,
    limitDbm: (i) => 24 - above6(i.antennaGainDbi),
    clause: () => '47 CFR §15.407(a)(2): on U-NII-2C (5470–5725 MHz) 250 mW (24 dBm) conducted with antennas up to 6 dBi, less 1 dB per dB above 6 dBi; DFS required.',
  },
  {
    loMHz: 5725, hiMHz: 5850,
    limitDbm: (i) => 30 - (i.linkType === 'point-to-point' ? 0 : above6(i.antennaGainDbi)),
    clause: (i) => i.linkType === 'point-to-point'
      ? '47 CFR §15.247(c)(1)(ii) and §15.407(a)(3): on 5725–5850 MHz a fixed point-to-point link may use 1 W (30 dBm) conducted with any antenna gain, without reduction.'
      : '47 CFR §15.247(b)(3) and §15.407(a)(3): on 5725–5850 MHz 1 W (30 dBm) conducted with antennas up to 6 dBi, less 1 dB per dB above 6 dBi.',
  },
];

const tpcNote = (i: RegulatoryInput) => (i.tpc === false ? ' without TPC (3 dB lower than with it)' : ' assuming TPC is on (3 dB lower without it)');
// ETSI EN 300 328 and EN 301 893 / ECC/DEC/(04)08: EU limits are on EIRP, whatever the antenna.
const EU_BANDS: Band[] = [
  {
    loMHz: 2400, hiMHz: 2483.5,
    limitDbm: () => 20,
    clause: () => 'ETSI EN 300 328: on 2400–2483.5 MHz wideband data may radiate at most 100 mW (20 dBm) EIRP, whatever the antenna.',
  },
  {
    loMHz: 5150, hiMHz: 5250,
    limitDbm: () => 23,
    clause: () => 'ETSI EN 301 893 and ECC/DEC/(04)08: on 5150–5250 MHz at most 200 mW (23 dBm) EIRP, indoor use only.',
  },
  {
    loMHz: 5250, hiMHz: 5350,
    limitDbm: (i) => (i.tpc === false ? 20 : 23),
    clause: (i) => `ETSI EN 301 893 and ECC/DEC/(04)08: on 5250–5350 MHz at most 200 mW (23 dBm) EIRP, indoor use only, with DFS;${tpcNote(i)}.`,
  },
  {
    loMHz: 5470, hiMHz: 5725,
    limitDbm: (i) => (i.tpc === false ? 27 : 30),
    clause: (i) => `ETSI EN 301 893 and ECC/DEC/(04)08: on 5470–5725 MHz at most 1 W (30 dBm) EIRP with DFS;${tpcNote(i)}.`,
  },
];

const BANDS: Record<RegulatoryRegion, Band[]> = { US: US_BANDS, EU: EU_BANDS };

function findBand(region: string, freqMHz: number): Band {
  if (!(REGULATORY_REGIONS as readonly string[]).includes(region)) {
    throw new PlanningError(400, 'unknown_region', `Region "${region}" has no rules here; choose US or EU.`);
  }
  const bands = BANDS[region as RegulatoryRegion];
  const band = bands.find((b) => freqMHz >= b.loMHz && freqMHz <= b.hiMHz);
  if (!band) {
    const list = bands.map((b) => `${b.loMHz}–${b.hiMHz}`).join(', ');
    throw new PlanningError(400, 'frequency_not_licence_exempt', `${freqMHz} MHz is outside the ${region} licence-exempt bands checked here (${list} MHz); pick a frequency inside one of them.`);
  }
  return band;
}

/** Largest power allowed for this antenna and link type, and a verdict on the radio's setting. */
export function computeRegulatory(input: RegulatoryInput): RegulatoryAnswer {
  const band = findBand(input.region, input.freqMHz);
  const limit = band.limitDbm(input);
  const eirpDbm = round2(input.txPowerDbm + input.antennaGainDbi - input.cableLossDb);
  const isUs = input.region === 'US';
  // US: cable loss does not buy extra conducted power. EU: it does, because only EIRP is limited.
  const maxTxPowerDbm = round2(isUs ? limit : limit - input.antennaGainDbi + input.cableLossDb);
  const maxEirpDbm = round2(isUs ? limit + input.antennaGainDbi : limit);
  const tolerance = 1e-9;
  const compliant = isUs ? input.txPowerDbm <= maxTxPowerDbm + tolerance : eirpDbm <= maxEirpDbm + tolerance;
  const verdict = compliant
    ? `${fmt(input.txPowerDbm)} dBm into ${fmt(input.antennaGainDbi)} dBi is within it (max ${fmt(maxTxPowerDbm)} dBm from the radio, ${fmt(maxEirpDbm)} dBm EIRP).`
    : `${fmt(input.txPowerDbm)} dBm into ${fmt(input.antennaGainDbi)} dBi exceeds it: lower the radio to ${fmt(maxTxPowerDbm)} dBm or less (${fmt(maxEirpDbm)} dBm EIRP).`;
  return { maxTxPowerDbm, maxEirpDbm, eirpDbm, compliant, rule: `${band.clause(input)} ${verdict} ${GUIDANCE}` };
}
