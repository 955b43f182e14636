import type { RadioDto } from '../../shared/schemas/radio';
import type { Radio } from '../models';
import type { Actor } from '../policies/actor';
import { radioAbilities } from '../policies/radio';
import { iso } from './common';

/** The pre-shared key never leaves the server here: only whether one is set. */
export function presentRadio(r: Radio, neighbourhoodId: number, actor: Actor): RadioDto {
  return {
    id: r.id,
    nodeId: r.nodeId,
    iface: r.iface,
    band: r.band,
    channel: r.channel,
    channelWidthMHz: r.channelWidthMHz,
    txPowerDbm: r.txPowerDbm,
    antennaGainDbi: r.antennaGainDbi,
    polarisation: r.polarisation,
    cableLossDb: r.cableLossDb,
    role: r.role,
    ssid: r.ssid ?? null,
    encryption: r.encryption,
    hasPreSharedKey: Boolean(r.preSharedKey),
    groupRekeyS: r.groupRekeyS,
    mac: r.mac ?? null,
    macReportedAt: iso(r.macReportedAt ?? null),
    createdAt: iso(r.createdAt)!,
    updatedAt: iso(r.updatedAt)!,
    abilities: radioAbilities(actor, { neighbourhoodId }),
  };
}
