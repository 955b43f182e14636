import type { NetworkSettingsDto } from '../../shared/schemas/planningRecords';
import type { NetworkSettings } from '../models';
import { isAdmin, type Actor } from '../policies/actor';
import { iso } from './common';

export function presentNetworkSettings(s: NetworkSettings, actor: Actor): NetworkSettingsDto {
  return {
    name: s.name,
    region: s.region,
    timeZone: s.timeZone,
    addressPool: s.addressPool ?? null,
    updatedAt: iso(s.updatedAt)!,
    abilities: { update: isAdmin(actor) },
  };
}
