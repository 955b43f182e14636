import { PlanningError } from './errors';
import { dfsGuidance, type DfsGuidance } from './dfs';

export const REGULATORY_REGIONS = ['US', 'EU'] as const;
export type RegulatoryRegion = (typeof REGULATORY_REGIONS)[number];
export const LINK_TYPES = ['point-to-point', 'point-to-multipoint'] as const;
export type LinkType = (typeof LINK_TYPES)[number];
export const DEPLOYMENTS = ['outdoor', 'indoor'] as const;
export type Deployment = (typeof DEPLOYMENTS)[number];

export interface RegulatoryInput {
  region: string;
  /** Centre of the occupied channel. */
  freqMHz: number;
  antennaGainDbi: number;
  txPowerDbm: number;
  cableLossDb: number;
  linkType: LinkType;
  /** Occupied width; the whole channel must lie in one band (default 20). */
  channelWidthMHz?: number;
  /** EU 5 GHz only: transmit power control fitted (default true); without it the 5250–5725 MHz limits are 3 dB lower. */
  tpc?: boolean;
  /** Default outdoor; EU 5150–5350 MHz is indoor only. */
  deployment?: Deployment;
}
export interface RegulatoryAnswer {
  maxTxPowerDbm: number;
  maxEirpDbm: number;
  eirpDbm: number;
  compliant: boolean;
  rule: string;
  /** The band the centre falls in and the spectrum the channel occupies, MHz. */
  bandMHz: { lo: number; hi: number };
  occupiedMHz: { lo: number; hi: number };
  /** Each reason the setting is not compliant, in words; empty when compliant. */
  problems: string[];
  dfs: DfsGuidance | null;
}

interface Band {
  loMHz: number;
  hiMHz: number;
  /** US: conducted-power limit from the radio's output; EU: EIRP limit. */
  limitDbm: (input: RegulatoryInput) => number;
  clause: (input: RegulatoryInput) => string;
  indoorOnly?: boolean;
}

const GUIDANCE = 'Guidance only: the local regulator decides.';
const fmt = (x: number) => x.toFixed(2);
// Answers carry 0.01 dB; the verdict compares the same rounded figures the person sees.
const round2 = (x: number) => Math.round(x * 100) / 100;
const above = (gainDbi: number, allowedDbi: number) => Math.max(0, gainDbi - allowedDbi);
/** 250 mW in dBm, 10·log10(250) = 23.98 (§15.407(a)(2)); kept exact rather than rounded to 24. */
const MW250_DBM = 10 * Math.log10(250);
// §15.407(a)(2): the lesser of 250 mW or 11 dBm + 10·log10(B), B the 26 dB emission bandwidth in MHz, here taken as the channel width (from memory).
const unii2LimitDbm = (i: RegulatoryInput) => Math.min(MW250_DBM, 11 + 10 * Math.log10(i.channelWidthMHz ?? 20)) - above(i.antennaGainDbi, 6);

// 47 CFR §15.247(b)(3),(c)(1) and §15.407(a): US limits are on conducted power; gain above 6 dBi reduces it.
// A gain that is not 6 + 3n dBi on a 2.4 GHz point-to-point link is reduced proportionally, (G − 6)/3, not rounded.
const US_BANDS: Band[] = [
  {
    loMHz: 2400,
    hiMHz: 2483.5,
    limitDbm: (i) => 30 - (i.linkType === 'point-to-point' ? above(i.antennaGainDbi, 6) / 3 : above(i.antennaGainDbi, 6)),
    clause: (i) =>
      i.linkType === 'point-to-point'
        ? '47 CFR §15.247(b)(3) and (c)(1)(i): on 2400–2483.5 MHz a fixed point-to-point link may use 1 W (30 dBm) conducted with antennas up to 6 dBi, less 1 dB for every 3 dB of gain above 6 dBi (applied in proportion, not rounded).'
        : '47 CFR §15.247(b)(3) and (b)(4): on 2400–2483.5 MHz 1 W (30 dBm) conducted with antennas up to 6 dBi, less 1 dB for every dB of gain above 6 dBi (36 dBm EIRP).',
  },
  {
    loMHz: 5150,
    hiMHz: 5250,
    limitDbm: (i) => 30 - above(i.antennaGainDbi, i.linkType === 'point-to-point' ? 23 : 6),
    clause: (i) =>
      i.linkType === 'point-to-point'
        ? '47 CFR §15.407(a)(1)(iii): on U-NII-1 (5150–5250 MHz) a fixed point-to-point access point may use 1 W (30 dBm) conducted with antennas up to 23 dBi without reduction, less 1 dB per dB above 23 dBi.'
        : i.deployment === 'indoor'
          ? '47 CFR §15.407(a)(1)(ii): on U-NII-1 (5150–5250 MHz) an indoor access point may use 1 W (30 dBm) conducted with antennas up to 6 dBi, less 1 dB per dB above 6 dBi.'
          : '47 CFR §15.407(a)(1)(i): on U-NII-1 (5150–5250 MHz) an outdoor access point may use 1 W (30 dBm) conducted with antennas up to 6 dBi, less 1 dB per dB above 6 dBi; EIRP above 30° elevation is capped at 125 mW (21 dBm).',
  },
  {
    loMHz: 5250,
    hiMHz: 5350,
    limitDbm: unii2LimitDbm,
    clause: () =>
      '47 CFR §15.407(a)(2): on U-NII-2A (5250–5350 MHz) the lesser of 250 mW (23.98 dBm) or 11 dBm + 10·log10(B) conducted with antennas up to 6 dBi, less 1 dB per dB above 6 dBi; DFS required (§15.407(h)).',
  },
  {
    loMHz: 5470,
    hiMHz: 5725,
    limitDbm: unii2LimitDbm,
    clause: () =>
      '47 CFR §15.407(a)(2): on U-NII-2C (5470–5725 MHz) the lesser of 250 mW (23.98 dBm) or 11 dBm + 10·log10(B) conducted with antennas up to 6 dBi, less 1 dB per dB above 6 dBi; DFS required (§15.407(h)).',
  },
  {
    loMHz: 5725,
    hiMHz: 5850,
    limitDbm: (i) => 30 - (i.linkType === 'point-to-point' ? 0 : above(i.antennaGainDbi, 6)),
    clause: (i) =>
      i.linkType === 'point-to-point'
        ? '47 CFR §15.247(c)(1)(ii) and §15.407(a)(3): on 5725–5850 MHz a fixed point-to-point link may use 1 W (30 dBm) conducted with any antenna gain, without reduction.'
        : '47 CFR §15.247(b)(3) and §15.407(a)(3): on 5725–5850 MHz 1 W (30 dBm) conducted with antennas up to 6 dBi, less 1 dB per dB above 6 dBi.',
  },
];

const tpcNote = (i: RegulatoryInput) => (i.tpc === false ? ' without TPC, 3 dB lower than with it' : ' with TPC (3 dB lower without it)');
// ETSI EN 300 328 and EN 301 893 / ECC/DEC/(04)08: EU limits are on EIRP, whatever the antenna.
const EU_BANDS: Band[] = [
  {
    loMHz: 2400,
    hiMHz: 2483.5,
    limitDbm: () => 20,
    clause: () => 'ETSI EN 300 328: on 2400–2483.5 MHz wideband data may radiate at most 100 mW (20 dBm) EIRP, whatever the antenna.',
  },
  {
    loMHz: 5150,
    hiMHz: 5250,
    indoorOnly: true,
    limitDbm: () => 23,
    clause: () => 'ETSI EN 301 893 and ECC/DEC/(04)08: on 5150–5250 MHz at most 200 mW (23 dBm) EIRP, indoor use only.',
  },
  {
    loMHz: 5250,
    hiMHz: 5350,
    indoorOnly: true,
    limitDbm: (i) => (i.tpc === false ? 20 : 23),
    clause: (i) => `ETSI EN 301 893 and ECC/DEC/(04)08: on 5250–5350 MHz at most 200 mW (23 dBm) EIRP, indoor use only, with DFS;${tpcNote(i)}.`,
  },
  {
    loMHz: 5470,
    hiMHz: 5725,
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
    throw new PlanningError(
      400,
      'frequency_not_licence_exempt',
      `${freqMHz} MHz is outside the ${region} licence-exempt bands checked here (${list} MHz); pick a frequency inside one of them.`,
    );
  }
  return band;
}

/** Why the occupied channel is not inside its band, naming the edge it crosses; null when it fits. */
function edgeProblem(band: Band, lo: number, hi: number, widthMHz: number, centreMHz: number, region: string): string | null {
  const edge = lo < band.loMHz ? band.loMHz : hi > band.hiMHz ? band.hiMHz : null;
  if (edge === null) return null;
  // From memory: the FCC lets a channel straddle 5725 MHz (channel 144) when each part meets its own band's rule; not modelled here.
  const straddle =
    region === 'US' && edge === 5725
      ? ' A US channel across 5725 MHz needs each part to meet its own band’s rule; this check does not model that, so ask the regulator.'
      : '';
  return `The ${widthMHz} MHz channel centred at ${centreMHz} MHz occupies ${lo}–${hi} MHz and crosses the band edge at ${edge} MHz: the whole channel must lie inside ${band.loMHz}–${band.hiMHz} MHz. Move the centre or narrow the channel.${straddle}`;
}

/** Largest power allowed for this antenna, link type, width and deployment, and a verdict on the radio's setting. */
export function computeRegulatory(input: RegulatoryInput): RegulatoryAnswer {
  const band = findBand(input.region, input.freqMHz);
  const widthMHz = input.channelWidthMHz ?? 20;
  const lo = input.freqMHz - widthMHz / 2;
  const hi = input.freqMHz + widthMHz / 2;
  const limit = band.limitDbm(input);
  const eirpDbm = round2(input.txPowerDbm + input.antennaGainDbi - input.cableLossDb);
  const isUs = input.region === 'US';
  // US: cable loss does not buy extra conducted power. EU: it does, because only EIRP is limited.
  const maxTxPowerDbm = round2(isUs ? limit : limit - input.antennaGainDbi + input.cableLossDb);
  const maxEirpDbm = round2(isUs ? limit + input.antennaGainDbi : limit);
  const tolerance = 1e-9;
  const powerOk = isUs ? input.txPowerDbm <= maxTxPowerDbm + tolerance : eirpDbm <= maxEirpDbm + tolerance;
  const problems: string[] = [];
  const edge = edgeProblem(band, lo, hi, widthMHz, input.freqMHz, input.region);
  if (edge) problems.push(edge);
  if (band.indoorOnly && (input.deployment ?? 'outdoor') === 'outdoor') {
    problems.push(
      `${band.loMHz}–${band.hiMHz} MHz is for indoor use only in the ${input.region} (ECC/DEC/(04)08): a rooftop or mast link may not use it. Use 5470–5725 MHz outdoors.`,
    );
  }
  if (!powerOk) {
    problems.push(
      `${fmt(input.txPowerDbm)} dBm into ${fmt(input.antennaGainDbi)} dBi exceeds the limit: lower the radio to ${fmt(maxTxPowerDbm)} dBm or less (${fmt(maxEirpDbm)} dBm EIRP).`,
    );
  }
  const verdict = powerOk
    ? `${fmt(input.txPowerDbm)} dBm into ${fmt(input.antennaGainDbi)} dBi is within the power limit (max ${fmt(maxTxPowerDbm)} dBm from the radio, ${fmt(maxEirpDbm)} dBm EIRP).`
    : problems[problems.length - 1];
  const others = problems.filter((p) => p !== verdict);
  const dfs = dfsGuidance(input.region as RegulatoryRegion, lo, hi);
  const rule = [band.clause(input), verdict, ...others, dfs ? dfs.advice : '', GUIDANCE].filter(Boolean).join(' ');
  return {
    maxTxPowerDbm,
    maxEirpDbm,
    eirpDbm,
    compliant: problems.length === 0,
    rule,
    bandMHz: { lo: band.loMHz, hi: band.hiMHz },
    occupiedMHz: { lo, hi },
    problems,
    dfs,
  };
}
