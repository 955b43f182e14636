import type { LinkDto } from '../../shared/schemas/link';
import type { Link } from '../models';
import { iso } from './common';

/** A link loaded with both ends' radios, with what the caller may do to it (policies/link.ts linkAbilities). */
export function presentLink(l: Link, abilities: { update: boolean; delete: boolean }): LinkDto {
  return {
    id: l.id,
    name: l.name ?? null,
    radioAId: l.radioAId,
    radioBId: l.radioBId,
    nodeAId: l.radioA!.nodeId,
    nodeBId: l.radioB!.nodeId,
    status: l.status,
    createdAt: iso(l.createdAt)!,
    updatedAt: iso(l.updatedAt)!,
    abilities,
  };
}
