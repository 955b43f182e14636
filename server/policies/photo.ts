import type { Site } from '../models';
import { type Actor, isHostOfSite, mayManage } from './actor';

/** Admins, the site's operators and its host may add install photos; only managers remove them. */
export const mayAddPhoto = (a: Actor, s: Pick<Site, 'id' | 'neighbourhoodId'>) => mayManage(a, s.neighbourhoodId) || isHostOfSite(a, s.id);
export const photoAbilities = (a: Actor, s: Pick<Site, 'neighbourhoodId'>) => ({ delete: mayManage(a, s.neighbourhoodId) });
