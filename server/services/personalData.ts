import { QueryTypes, type Sequelize } from 'sequelize';
import { endSessionsOf } from '../auth/accountTokens';
import { OperatorAssignment, Site, User } from '../models';

const rows = (sequelize: Sequelize, sql: string, userId: number) => sequelize.query<Record<string, unknown>>(sql, { bind: [userId], type: QueryTypes.SELECT });

/** Everything Parapet holds about one person, for a data-access request. The password hash is never part of it. */
export async function exportPerson(sequelize: Sequelize, user: User) {
  const id = user.id;
  const [neighbourhoods, hostedSites, preferences, maintenanceWindows, acknowledgedOutages, mail, photos, siteSurveys, changesMade, changesAbout] =
    await Promise.all([
      rows(
        sequelize,
        `SELECT n.id, n.name FROM operator_assignments a JOIN neighbourhoods n ON n.id = a.neighbourhood_id WHERE a.user_id = $1 ORDER BY n.name`,
        id,
      ),
      rows(
        sequelize,
        `SELECT id, name, neighbourhood_id AS "neighbourhoodId", access_notes AS "accessNotes" FROM sites WHERE host_user_id = $1 ORDER BY id`,
        id,
      ),
      rows(
        sequelize,
        `SELECT operator_mode AS "operatorMode", host_mail AS "hostMail", quiet_start AS "quietStart", quiet_end AS "quietEnd",
                            unsubscribed_at AS "unsubscribedAt", updated_at AS "updatedAt" FROM alert_preferences WHERE user_id = $1`,
        id,
      ),
      rows(
        sequelize,
        `SELECT id, node_id AS "nodeId", starts_at AS "startsAt", ends_at AS "endsAt", reason, cancelled_at AS "cancelledAt" FROM maintenance_windows WHERE created_by = $1 ORDER BY id`,
        id,
      ),
      rows(sequelize, `SELECT id, node_id AS "nodeId", acknowledged_at AS "acknowledgedAt", notes FROM outages WHERE acknowledged_by = $1 ORDER BY id`, id),
      rows(
        sequelize,
        `SELECT id, kind, recipient_address AS "address", subject, status, created_at AS "createdAt", sent_at AS "sentAt" FROM outbox WHERE recipient_user_id = $1 ORDER BY id`,
        id,
      ),
      rows(sequelize, `SELECT id, site_id AS "siteId", caption, created_at AS "createdAt" FROM photos WHERE uploaded_by = $1 ORDER BY id`, id),
      rows(
        sequelize,
        `SELECT id, node_id AS "nodeId", file_name AS "fileName", created_at AS "createdAt" FROM site_surveys WHERE uploaded_by = $1 ORDER BY id`,
        id,
      ),
      rows(
        sequelize,
        `SELECT id, table_name AS "table", record_id AS "recordId", action, changed_at AS "changedAt", before, after FROM change_history WHERE changed_by = $1 ORDER BY id`,
        id,
      ),
      rows(
        sequelize,
        `SELECT id, action, changed_at AS "changedAt", before, after FROM change_history WHERE table_name = 'users' AND record_id = $1::text ORDER BY id`,
        id,
      ),
    ]);
  return {
    exportedAt: new Date().toISOString(),
    person: {
      id,
      email: user.email,
      name: user.name,
      role: user.role,
      phone: user.phone ?? null,
      active: user.active,
      createdAt: user.createdAt,
      updatedAt: user.updatedAt,
      erasedAt: user.erasedAt ?? null,
    },
    operatorOf: neighbourhoods,
    hostedSites,
    mailPreferences: preferences[0] ?? null,
    maintenanceWindowsAnnounced: maintenanceWindows,
    outagesAcknowledged: acknowledgedOutages,
    mailSent: mail,
    photosUploaded: photos,
    siteSurveysUploaded: siteSurveys,
    changesMade,
    changesToTheirAccount: changesAbout,
  };
}

export const formerName = (id: number) => `Former member #${id}`;
export const erasedAddress = (id: number) => `erased-${id}@erased.invalid`;

/**
 * Anonymises a person and keeps the network's records: their sites stay (host cleared), outages keep the
 * acknowledgement (its actor is now "Former member #id"), audit entries keep the anonymised actor.
 * Mail addressed to them and their own settings go; their account's history loses the old values.
 */
export async function erasePerson(sequelize: Sequelize, user: User, now: Date) {
  await sequelize.transaction(async (transaction) => {
    const q = (sql: string, bind: unknown[]) => sequelize.query(sql, { bind, transaction });
    for (const site of await Site.findAll({ where: { hostUserId: user.id }, transaction })) await site.update({ hostUserId: null }, { transaction });
    await OperatorAssignment.destroy({ where: { userId: user.id }, transaction });
    await q(`DELETE FROM alert_preferences WHERE user_id = $1`, [user.id]);
    await q(`DELETE FROM outbox WHERE recipient_user_id = $1`, [user.id]);
    await q(`DELETE FROM account_tokens WHERE user_id = $1`, [user.id]);
    await user.update(
      { name: formerName(user.id), email: erasedAddress(user.id), phone: null, passwordHash: null, active: false, erasedAt: now },
      { transaction },
    );
    // Old values of name, e-mail and phone in this account's own history are personal data too.
    await q(
      `UPDATE change_history SET
         before = CASE WHEN before IS NULL THEN NULL ELSE before - 'phone' || jsonb_strip_nulls(jsonb_build_object(
                    'name', CASE WHEN before ? 'name' THEN to_jsonb($2::text) END, 'email', CASE WHEN before ? 'email' THEN to_jsonb($3::text) END)) END,
         after = CASE WHEN after IS NULL THEN NULL ELSE after - 'phone' || jsonb_strip_nulls(jsonb_build_object(
                    'name', CASE WHEN after ? 'name' THEN to_jsonb($2::text) END, 'email', CASE WHEN after ? 'email' THEN to_jsonb($3::text) END)) END
       WHERE table_name = 'users' AND record_id = $1::text`,
      [user.id, formerName(user.id), erasedAddress(user.id)],
    );
    await endSessionsOf(sequelize, user.id, undefined, transaction);
  });
}
