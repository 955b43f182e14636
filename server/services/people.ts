import type { Sequelize } from 'sequelize';
import type { z } from 'zod';
import type { meUpdateSchema } from '../../shared/schemas/account';
import type { UserCreate, userUpdateSchema } from '../../shared/schemas/user';
import { endSessionsOf } from '../auth/accountTokens';
import { hashPassword } from '../auth/passwords';
import { Conflict, NotFound } from '../errors';
import { OperatorAssignment, User } from '../models';
import { uniquely } from './conflicts';
import { domainEvents } from './events';

const DUPLICATE_EMAIL = 'Someone already has that e-mail address.';

/** The neighbourhoods each of these people is assigned to operate, as a lookup by person. */
export async function assignmentsOf(userIds: number[]) {
  const rows = await OperatorAssignment.findAll({ where: { userId: userIds } });
  return (id: number) =>
    rows
      .filter((r) => r.userId === id)
      .map((r) => r.neighbourhoodId)
      .sort((a, b) => a - b);
}

export async function findPerson(id: number, what = `Person ${id}`) {
  const u = await User.findByPk(id);
  if (!u) throw NotFound(what);
  return u;
}

/** A new person with a checked password; the unique index settles a race between two admins adding the same address. */
export async function createPerson(fields: Omit<UserCreate, 'password'>, password: string) {
  if (await User.findOne({ where: { email: fields.email } })) throw Conflict(DUPLICATE_EMAIL, 'duplicate');
  const passwordHash = await hashPassword(password);
  return uniquely(() => User.create({ ...fields, passwordHash }), DUPLICATE_EMAIL);
}

/** Role and active changes drop operator assignments that no longer apply and move the person's open sockets. */
export async function updatePerson(user: User, changes: z.output<typeof userUpdateSchema>) {
  await User.sequelize!.transaction(async (transaction) => {
    await user.update(changes, { transaction });
    // Assignments belong to operators only.
    if (changes.role && changes.role !== 'operator') await OperatorAssignment.destroy({ where: { userId: user.id }, transaction });
  });
  if (changes.role !== undefined || changes.active !== undefined) domainEvents.emit('access-changed', { userIds: [user.id] });
}

/** Each person's own contact details; the role is the admins' to change. */
export async function updateOwnAccount(user: User, changes: z.output<typeof meUpdateSchema>) {
  await user.update(changes);
}

export async function removePerson(user: User) {
  await user.destroy();
  domainEvents.emit('access-changed', { userIds: [user.id] });
}

/**
 * A new password for oneself: reset links from before the change stop working, and other devices are signed out;
 * the session `keepSid` stays.
 */
export async function changeOwnPassword(sequelize: Sequelize, user: User, newPassword: string, keepSid: string) {
  const passwordHash = await hashPassword(newPassword);
  await sequelize.transaction(async (transaction) => {
    await user.update({ passwordHash }, { transaction });
    await sequelize.query(`UPDATE account_tokens SET used_at = now() WHERE user_id = $1 AND purpose = 'password-reset' AND used_at IS NULL`, {
      bind: [user.id],
      transaction,
    });
    await endSessionsOf(sequelize, user.id, keepSid, transaction);
  });
}
