import { computeLinkBudget, type LinkBudgetAnswer } from '../../shared/radio/plan';
import { channelCenterMHz } from '../../shared/radio/channels';
import type { Sequelize } from 'sequelize';
import type { ChannelWidthMHz } from '../../shared/enums';
import type { LinkBudgetInput } from '../../shared/radio/plan';
import { terrainProfile } from './terrain';

export interface RadioEnd {
  band: '2.4' | '5';
  channel: number;
  channelWidthMHz: number;
  txPowerDbm: number;
  antennaGainDbi: number;
  cableLossDb: number;
  latitude: number;
  longitude: number;
  groundElevationM: number;
  antennaHeightM: number;
}

// The budget is a pure function of the two ends, and a big town's map asks for thousands of them on every
// read: answers are kept by their inputs (no invalidation needed), cleared whole when the table fills.
const PREDICTION_MEMO_MAX = 50_000;
const predictions = new Map<string, LinkBudgetAnswer | null>();
const endKey = (e: RadioEnd) =>
  [e.band, e.channel, e.channelWidthMHz, e.txPowerDbm, e.antennaGainDbi, e.cableLossDb, e.latitude, e.longitude, e.groundElevationM, e.antennaHeightM].join(
    ',',
  );

/** The predicted budget of a link from radio a toward radio b, from the inventory; null if it cannot be computed. */
export function predictLink(a: RadioEnd, b: RadioEnd): LinkBudgetAnswer | null {
  const key = `${endKey(a)}|${endKey(b)}`;
  if (predictions.has(key)) return predictions.get(key)!;
  const answer = computePrediction(a, b);
  if (predictions.size >= PREDICTION_MEMO_MAX) predictions.clear();
  predictions.set(key, answer);
  return answer;
}

function computePrediction(a: RadioEnd, b: RadioEnd): LinkBudgetAnswer | null {
  try {
    return computeLinkBudget({
      a: { lat: a.latitude, lon: a.longitude, heightM: a.antennaHeightM, groundElevationM: a.groundElevationM },
      b: { lat: b.latitude, lon: b.longitude, heightM: b.antennaHeightM, groundElevationM: b.groundElevationM },
      freqMHz: channelCenterMHz(a.band, a.channel),
      channelWidthMHz: a.channelWidthMHz as ChannelWidthMHz,
      txPowerDbm: a.txPowerDbm,
      txAntennaGainDbi: a.antennaGainDbi,
      txCableLossDb: a.cableLossDb,
      rxAntennaGainDbi: b.antennaGainDbi,
      rxCableLossDb: b.cableLossDb,
    });
  } catch {
    return null;
  }
}

/**
 * The planning link budget; with `terrain: true` the ground under the path comes from the elevation tiles, and so does
 * each end's ground elevation when the body leaves it out (API.md "Terrain").
 */
export async function linkBudgetWithTerrain(sequelize: Sequelize, body: LinkBudgetInput & { terrain?: boolean }): Promise<LinkBudgetAnswer> {
  const { terrain, ...input } = body;
  if (!terrain || !input.a || !input.b) return computeLinkBudget(input);
  // Too-far or too-close sites are refused by the budget before any tile is read.
  computeLinkBudget(input);
  const profile = await terrainProfile(sequelize, input.a, input.b);
  const a = { ...input.a, groundElevationM: input.a.groundElevationM ?? profile[0].groundM };
  const b = { ...input.b, groundElevationM: input.b.groundElevationM ?? profile[profile.length - 1].groundM };
  return computeLinkBudget({ ...input, a, b, terrainProfile: profile });
}
