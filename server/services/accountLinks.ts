import { randomBytes } from 'node:crypto';
import type { Sequelize, Transaction } from 'sequelize';
import type { Role } from '../../shared/enums';
import { passwordProblem } from '../../shared/security/passwordRules';
import { endSessionsOf, issueAccountToken, spendAccountToken } from '../auth/accountTokens';
import { hashPassword } from '../auth/passwords';
import type { Config } from '../config';
import { Conflict, Invalid } from '../errors';
import { formatLocal } from '../mail/templates/compose';
import { invitationMail, passwordResetMail } from '../mail/templates/account';
import { NetworkSettings, type Site, User } from '../models';
import { enqueue } from './outbox';

const timeZone = async (transaction: Transaction) => (await NetworkSettings.findByPk(1, { transaction }))?.timeZone ?? 'UTC';
const linkUrl = (config: Config, kind: 'invite' | 'reset', token: string) => `${config.publicUrl.replace(/\/$/, '')}/${kind}/${token}`;

/** The demo's password is printed in the README and by start.sh, so it is as good as public. */
export const PUBLISHED_DEMO_PASSWORD = 'parapet-demo';

/**
 * Refuses, beyond the schema's checks, a password built from the person's own name or address words,
 * and — outside the demo — the published demo password.
 */
export function assertPasswordFor(config: Pick<Config, 'demoMode' | 'demoPassword'>, user: Pick<User, 'name' | 'email'>, password: string, field: string) {
  const published = [PUBLISHED_DEMO_PASSWORD, config.demoPassword].map((p) => p.toLowerCase());
  const problem =
    !config.demoMode && published.includes(password.toLowerCase())
      ? 'is the published demo password; choose one of your own'
      : passwordProblem(password, [user.name, user.email]);
  if (problem) throw Invalid(`The request body is invalid: ${field} ${problem}.`, [{ path: field, message: `${field} ${problem}` }]);
}

/**
 * Creates the invited person (inactive, no password) or refreshes a pending invitation, and writes the
 * mail to the outbox in the same transaction. Someone who already has an account is a conflict.
 */
export async function invite(
  sequelize: Sequelize,
  config: Config,
  input: { email: string; name: string; role: Role },
  invitedBy: string,
  hostOf: { site: Site; onlyNewPeople: boolean } | null = null,
) {
  const now = config.now();
  return sequelize.transaction(async (transaction) => {
    let user = await User.findOne({ where: { email: input.email }, transaction, lock: transaction.LOCK.UPDATE });
    if (user && (user.active || user.passwordHash || user.erasedAt)) throw Conflict('Someone already has that e-mail address.', 'duplicate');
    // An operator's invitation never touches someone else's pending one (an admin may have invited them with another role).
    if (user && hostOf?.onlyNewPeople) throw Conflict('Someone already has that e-mail address. Ask an admin to make them the host.', 'duplicate');
    if (user) await user.update({ name: input.name, role: input.role }, { transaction });
    else user = await User.create({ email: input.email, name: input.name, role: input.role, active: false, passwordHash: null }, { transaction });
    if (hostOf) await hostOf.site.update({ hostUserId: user.id }, { transaction });
    const link = await issueAccountToken(
      sequelize,
      config.sessionSecret,
      { purpose: 'invitation', userId: user.id, now, ttlMs: config.invitationTtlMs },
      transaction,
    );
    const rendered = invitationMail({
      name: user.name,
      invitedBy,
      role: user.role,
      url: linkUrl(config, 'invite', link.token),
      expiresAt: formatLocal(link.expiresAt, await timeZone(transaction)),
    });
    await enqueue(
      sequelize,
      { kind: 'invitation', userId: user.id, address: user.email, name: user.name, dedupeKey: `invitation:${link.id}`, rendered, unsubscribeUrl: null },
      now,
      transaction,
    );
    return { user, expiresAt: link.expiresAt };
  });
}

/** Sets the first password and activates the account; the link is spent in the same transaction. */
export async function acceptInvitation(sequelize: Sequelize, config: Config, token: string, password: string) {
  return sequelize.transaction(async (transaction) => {
    const { userId } = await spendAccountToken(sequelize, config.sessionSecret, token, 'invitation', config.now(), transaction);
    const user = await User.findByPk(userId, { transaction, lock: transaction.LOCK.UPDATE });
    if (!user || user.erasedAt) throw Invalid('This invitation is for an account that no longer exists. Ask an admin to invite you again.');
    assertPasswordFor(config, user, password, 'password');
    await user.update({ passwordHash: await hashPassword(password), active: true }, { transaction });
    return user;
  });
}

/**
 * Writes a reset mail for an active account; for any other address it writes nothing and says nothing,
 * but still reads the settings and renders a mail, so both paths do about the same work (the route
 * then pads both to the same minimum time).
 */
export async function requestPasswordReset(sequelize: Sequelize, config: Config, email: string) {
  const now = config.now();
  await sequelize.transaction(async (transaction) => {
    const user = await User.findOne({ where: { email, active: true }, transaction });
    if (!user || user.erasedAt) {
      passwordResetMail({
        name: email,
        url: linkUrl(config, 'reset', randomBytes(48).toString('base64url')),
        expiresAt: formatLocal(new Date(now.getTime() + config.passwordResetTtlMs), await timeZone(transaction)),
      });
      return;
    }
    const link = await issueAccountToken(
      sequelize,
      config.sessionSecret,
      { purpose: 'password-reset', userId: user.id, now, ttlMs: config.passwordResetTtlMs },
      transaction,
    );
    const rendered = passwordResetMail({
      name: user.name,
      url: linkUrl(config, 'reset', link.token),
      expiresAt: formatLocal(link.expiresAt, await timeZone(transaction)),
    });
    await enqueue(
      sequelize,
      { kind: 'password-reset', userId: user.id, address: user.email, name: user.name, dedupeKey: `password-reset:${link.id}`, rendered, unsubscribeUrl: null },
      now,
      transaction,
    );
  });
}

/** Sets the new password and ends every session of the account, so whoever knew the old one is signed out. */
export async function completePasswordReset(sequelize: Sequelize, config: Config, token: string, password: string) {
  await sequelize.transaction(async (transaction) => {
    const { userId } = await spendAccountToken(sequelize, config.sessionSecret, token, 'password-reset', config.now(), transaction);
    const user = await User.findByPk(userId, { transaction, lock: transaction.LOCK.UPDATE });
    if (!user || !user.active) throw Invalid('This account is not active any more. Ask an admin.');
    assertPasswordFor(config, user, password, 'password');
    await user.update({ passwordHash: await hashPassword(password) }, { transaction });
    await endSessionsOf(sequelize, user.id, undefined, transaction);
  });
}
