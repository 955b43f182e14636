import type { MeDto } from '../../shared/schemas/account';
import type { SessionUser } from '../../shared/schemas/session';
import type { UserDto } from '../../shared/schemas/user';
import type { User } from '../models';
import type { Actor } from '../policies/actor';
import { userAbilities } from '../policies/user';
import { iso } from './common';

/** The password hash is never listed; contact details only for admins (the people page is theirs). */
export function presentUser(u: User, neighbourhoodIds: number[], actor: Actor): UserDto {
  return {
    id: u.id,
    email: u.email,
    name: u.name,
    role: u.role,
    phone: u.phone ?? null,
    active: u.active,
    invited: !u.active && !u.passwordHash && !u.erasedAt,
    erased: Boolean(u.erasedAt),
    neighbourhoodIds,
    createdAt: iso(u.createdAt)!,
    abilities: userAbilities(actor, u),
  };
}

export const presentSessionUser = (a: Actor): SessionUser => ({ id: a.id, email: a.email, name: a.name, role: a.role });

/** The caller's own account: contact details, no hash. */
export const presentMe = (u: User): MeDto => ({ id: u.id, email: u.email, name: u.name, role: u.role, phone: u.phone ?? null });
