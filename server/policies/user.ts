import type { User } from '../models';
import { type Actor, isAdmin } from './actor';

export const mayListPeople = isAdmin;
export const userAbilities = (a: Actor, u: Pick<User, 'id'>) => ({ update: isAdmin(a), delete: isAdmin(a) && a.id !== u.id });
