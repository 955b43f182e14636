import type { PreferencesDto, PreferencesUpdate } from '../../shared/schemas/alerts';
import { AlertPreference, NetworkSettings } from '../models';
import type { Actor } from '../policies/actor';

const hhmm = (t: string | null | undefined) => (t ? t.slice(0, 5) : null);

/** A person's mail choices, with the defaults filled in when they never changed any. */
export async function preferencesOf(actor: Actor): Promise<PreferencesDto> {
  const [row, settings] = await Promise.all([AlertPreference.findByPk(actor.id), NetworkSettings.findByPk(1)]);
  return {
    operatorMode: row?.operatorMode ?? 'immediate',
    hostMail: row?.hostMail ?? true,
    quietStart: hhmm(row?.quietStart),
    quietEnd: hhmm(row?.quietEnd),
    adminNodeMail: row?.adminNodeMail ?? false,
    adminSelfCheck: row?.adminSelfCheck ?? true,
    upstreamNotices: row?.upstreamNotices ?? false,
    degradedDigest: row?.degradedDigest ?? true,
    unsubscribedAt: row?.unsubscribedAt ? row.unsubscribedAt.toISOString() : null,
    timeZone: settings?.timeZone ?? 'UTC',
    applies: { operator: actor.role === 'operator', host: actor.hostedSiteIds.length > 0, admin: actor.role === 'admin' },
  };
}

/** Saves the fields given; choosing any mail again lifts an earlier unsubscribe. */
export async function updatePreferences(actor: Actor, patch: PreferencesUpdate) {
  const [row] = await AlertPreference.findOrCreate({ where: { userId: actor.id }, defaults: { userId: actor.id } });
  const values = Object.fromEntries(Object.entries(patch).filter(([, v]) => v !== undefined));
  await row.update(values);
  const turnedOn =
    patch.operatorMode === 'immediate' ||
    patch.operatorMode === 'hourly' ||
    [patch.hostMail, patch.adminNodeMail, patch.adminSelfCheck, patch.upstreamNotices, patch.degradedDigest].includes(true);
  if (turnedOn && row.unsubscribedAt) await row.update({ unsubscribedAt: null });
  return preferencesOf(actor);
}

/** One-click unsubscribe (RFC 8058): every kind of Parapet mail off for this person. */
export async function unsubscribeAll(userId: number, now: Date) {
  const [row] = await AlertPreference.findOrCreate({ where: { userId }, defaults: { userId } });
  await row.update({
    operatorMode: 'off',
    hostMail: false,
    adminNodeMail: false,
    adminSelfCheck: false,
    upstreamNotices: false,
    degradedDigest: false,
    unsubscribedAt: row.unsubscribedAt ?? now,
  });
}
