import type { Band, ChannelWidthMHz } from '../enums';
import { allowedChannelNumbers, channelCenterMHz, occupiedSpan, spanOverlapMHz, type ChannelRegion, type Span } from './channels';
import { PlanningError } from './errors';
import { haversineDistanceKm } from './geodesy';
import { freeSpacePathLossDb } from './pathLoss';
import { dbmToMw } from './units';

export interface RadioToPlan {
  id: number;
  nodeId: number;
  band: Band;
  channelWidthMHz: ChannelWidthMHz;
  lat: number;
  lon: number;
  eirpDbm?: number;
}
export interface RadioOnAir extends Omit<RadioToPlan, 'id'> {
  id?: number;
  channel: number;
}
/** One network seen in a site survey (see surveyCsv.ts). */
export interface ObservedNetwork {
  channel: number;
  channelWidthMHz?: number;
  signalDbm: number;
}
export interface ChannelPlanInput {
  region: ChannelRegion;
  radios: RadioToPlan[];
  nearby?: RadioOnAir[];
  /** Survey rows per band, as heard at the site being planned. */
  survey?: Partial<Record<Band, ObservedNetwork[]>>;
}
export interface ChannelAssignment {
  radioId: number;
  channel: number;
  centerMHz: number;
  channelWidthMHz: ChannelWidthMHz;
  /** Overlap with the node's own radios; 0 unless the band has no room left. */
  ownNodeOverlapMHz: number;
  /** Expected interference plus congestion, in mW (the cost below). */
  interferenceMw: number;
}

/** Assumed EIRP of a radio whose power is not given: 20 dBm, the EU 2.4 GHz ceiling (common practice). */
export const DEFAULT_EIRP_DBM = 20;
/**
 * Spectrum used for planning: 2.4 GHz blocks are widened by 2 MHz (a 20 MHz channel counts as 22 MHz, the 802.11b
 * mask) so channels 20 MHz apart are not treated as clean neighbours: this is what yields 1/6/11 (common practice).
 */
export function planningSpan(band: Band, channel: number, widthMHz: ChannelWidthMHz): Span {
  const span = occupiedSpan(band, channel, widthMHz);
  return { centerMHz: span.centerMHz, widthMHz: span.widthMHz + (band === '2.4' ? 2 : 0) };
}

/** Radios closer than this are treated as this far apart, so co-sited nodes get a finite, large weight. */
export const MIN_SEPARATION_KM = 0.01;

/**
 * Congestion per channel from a survey: the mW heard on each 20 MHz channel, every observed network
 * spread over the channels its width covers in proportion to overlap (dBm → mW, then summed).
 */
export function congestionMwByChannel(band: Band, allowed: number[], survey: ObservedNetwork[]): Map<number, number> {
  const out = new Map<number, number>();
  for (const ch of allowed) {
    const span = { centerMHz: channelCenterMHz(band, ch), widthMHz: 20 };
    out.set(
      ch,
      survey.reduce((sum, n) => sum + surveyCostMw(band, span, n), 0),
    );
  }
  return out;
}

/**
 * Spectrum a surveyed network occupies. A wide 5 GHz network sits on its fixed IEEE 802.11 bonding block, not around
 * its primary (primary 36 at 80 MHz covers 36–48; 48 at 80 MHz covers 36–48 too and never touches 52); 160 MHz blocks
 * start at 36, 100 and 149 (from memory). 20 and 22 MHz are centred on the channel.
 */
export function surveyedSpan(band: Band, channel: number, widthMHz: number): Span {
  if (widthMHz === 40 || widthMHz === 80) {
    try {
      return occupiedSpan(band, channel, widthMHz);
    } catch {
      // Not a bondable primary (e.g. 80 MHz reported on 2.4 GHz): fall back to the width around the channel.
    }
  }
  if (widthMHz === 160 && band === '5') {
    const base = channel >= 149 ? 149 : channel >= 100 ? 100 : 36;
    const first = base + Math.floor((channel - base) / 32) * 32;
    return { centerMHz: channelCenterMHz(band, first) + 70, widthMHz };
  }
  return { centerMHz: channelCenterMHz(band, channel), widthMHz };
}

function surveyCostMw(band: Band, span: Span, n: ObservedNetwork): number {
  const heard = surveyedSpan(band, n.channel, n.channelWidthMHz ?? 20);
  return (dbmToMw(n.signalDbm) * spanOverlapMHz(span, heard)) / span.widthMHz;
}

// Cost of a candidate block (documented model): for every other radio on the air, the power it would put into
// our receiver, EIRP − free-space loss (ITU-R P.525) over the distance between sites, in mW, scaled by the share of
// our block it overlaps; plus each surveyed network's mW scaled the same way. Own-node overlap is a separate,
// stronger criterion: a candidate that overlaps the node's own radios loses to any that does not.
function candidateCost(radio: RadioToPlan, span: Span, onAir: RadioOnAir[], survey: ObservedNetwork[]) {
  let ownNodeOverlapMHz = 0;
  let interferenceMw = 0;
  for (const other of onAir) {
    if (other.band !== radio.band) continue;
    const overlap = spanOverlapMHz(span, planningSpan(other.band, other.channel, other.channelWidthMHz));
    if (overlap === 0) continue;
    if (other.nodeId === radio.nodeId) ownNodeOverlapMHz += overlap;
    const distanceKm = Math.max(MIN_SEPARATION_KM, haversineDistanceKm(radio, other));
    const heardDbm = (other.eirpDbm ?? DEFAULT_EIRP_DBM) - freeSpacePathLossDb(span.centerMHz, distanceKm);
    interferenceMw += (dbmToMw(heardDbm) * overlap) / span.widthMHz;
  }
  for (const n of survey) interferenceMw += surveyCostMw(radio.band, span, n);
  return { ownNodeOverlapMHz, interferenceMw };
}

function candidates(region: ChannelRegion, band: Band, widthMHz: ChannelWidthMHz): number[] {
  // Channel 14 is 802.11b only; every radio planned here is OFDM.
  const allowed = allowedChannelNumbers(region, band).filter((c) => !(band === '2.4' && c === 14));
  const ok = new Set(allowed);
  const seen = new Set<number>();
  return allowed.filter((ch) => {
    if (band === '2.4' && widthMHz === 80) return false;
    const span = occupiedSpan(band, ch, widthMHz);
    if (!span.channels.every((c) => ok.has(c)) || seen.has(span.centerMHz * 1000 + span.channels[0])) return false;
    seen.add(span.centerMHz * 1000 + span.channels[0]);
    return true;
  });
}

/** Greedy, deterministic channel plan: radios in (node, wider first, id) order, each takes its cheapest block. */
export function recommendChannels(input: ChannelPlanInput): ChannelAssignment[] {
  const onAir: RadioOnAir[] = [...(input.nearby ?? [])];
  const order = [...input.radios].sort((x, y) => x.nodeId - y.nodeId || y.channelWidthMHz - x.channelWidthMHz || x.id - y.id);
  const out: ChannelAssignment[] = [];
  for (const radio of order) {
    const list = candidates(input.region, radio.band, radio.channelWidthMHz);
    if (list.length === 0) {
      throw new PlanningError(
        400,
        'no_channel_for_width',
        `No ${radio.channelWidthMHz} MHz channel is allowed on ${radio.band} GHz in ${input.region}; choose a narrower width.`,
      );
    }
    let best: ChannelAssignment | null = null;
    for (const channel of list) {
      const span = planningSpan(radio.band, channel, radio.channelWidthMHz);
      const cost = candidateCost(radio, span, onAir, input.survey?.[radio.band] ?? []);
      const better =
        !best ||
        cost.ownNodeOverlapMHz < best.ownNodeOverlapMHz ||
        (cost.ownNodeOverlapMHz === best.ownNodeOverlapMHz && cost.interferenceMw < best.interferenceMw * (1 - 1e-12));
      if (better) best = { radioId: radio.id, channel, centerMHz: span.centerMHz, channelWidthMHz: radio.channelWidthMHz, ...cost };
    }
    out.push(best!);
    onAir.push({ ...radio, channel: best!.channel });
  }
  return out.sort((x, y) => x.radioId - y.radioId);
}
