import type { SiteDto } from '../../shared/schemas/site';
import type { Site } from '../models';
import type { Actor } from '../policies/actor';
import { maySeeHostContact, siteAbilities } from '../policies/site';
import { iso } from './common';

export function presentSite(s: Site, actor: Actor): SiteDto {
  const contact = maySeeHostContact(actor, s);
  return {
    id: s.id,
    name: s.name,
    neighbourhoodId: s.neighbourhoodId,
    latitude: s.latitude,
    longitude: s.longitude,
    groundElevationM: s.groundElevationM,
    antennaHeightM: s.antennaHeightM,
    accessNotes: s.accessNotes ?? null,
    hostUserId: s.hostUserId ?? null,
    host: s.host ? { id: s.host.id, name: s.host.name, ...(contact ? { email: s.host.email, phone: s.host.phone ?? null } : {}) } : null,
    createdAt: iso(s.createdAt)!,
    updatedAt: iso(s.updatedAt)!,
    abilities: siteAbilities(actor, s),
  };
}
