import type { User } from '../models';
import { type Actor, isAdmin } from './actor';

export const mayListPeople = isAdmin;
export const userAbilities = (a: Actor, u: Pick<User, 'id' | 'erasedAt' | 'passwordHash' | 'active'>) => {
  const other = isAdmin(a) && a.id !== u.id;
  const erased = Boolean(u.erasedAt);
  return {
    update: isAdmin(a) && !erased,
    delete: other,
    export: isAdmin(a),
    erase: other && !erased,
    /** Send (again) the invitation of someone who has not chosen a password yet. */
    invite: isAdmin(a) && !erased && !u.passwordHash && !u.active,
  };
};
