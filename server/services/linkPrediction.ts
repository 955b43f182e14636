import { computeLinkBudget, type LinkBudgetAnswer } from '../../shared/radio/plan';
import { channelCenterMHz } from '../../shared/radio/channels';
import type { ChannelWidthMHz } from '../../shared/enums';

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

/** The predicted budget of a link from radio a toward radio b, from the inventory; null if it cannot be computed. */
export function predictLink(a: RadioEnd, b: RadioEnd): LinkBudgetAnswer | null {
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
