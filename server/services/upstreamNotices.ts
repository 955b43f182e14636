import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import type { Config } from '../config';
import { quietUntil } from '../mail/quietHours';
import { hostUpstream, partitionNotice } from '../mail/templates/upstream';
import { consoleUrl, footerLinks, nodeAudience, recoveryUrl } from './alertAudience';
import { enqueue } from './outbox';

interface HostRow {
  userId: number;
  name: string;
  email: string;
  nodeName: string;
  siteName: string;
  quietStart: string | null;
  quietEnd: string | null;
  timeZone: string | null;
}

/**
 * At most one `upstream-notice` per host and root outage, only to hosts who opted in, for nodes
 * still cut off behind it; people who already hear about the root itself are skipped.
 */
export async function writeUpstreamNotices(sequelize: Sequelize, config: Config, outageId: number, now: Date, transaction: Transaction) {
  const [outage] = await sequelize.query<{ nodeId: number; startedAt: Date; notified: boolean }>(
    'SELECT node_id AS "nodeId", started_at AS "startedAt", offline_notified_at IS NOT NULL AS notified FROM outages WHERE id = $1 AND ended_at IS NULL',
    { bind: [outageId], type: QueryTypes.SELECT, transaction },
  );
  if (!outage?.notified) return 0; // the root's own mail waits for its grace; these go with it
  const told = new Set((await nodeAudience(sequelize, outage.nodeId, transaction)).map((r) => r.userId));
  const hosts = await sequelize.query<HostRow>(
    `SELECT DISTINCT ON (u.id) u.id AS "userId", u.name, u.email, n.name AS "nodeName", s.name AS "siteName",
            to_char(p.quiet_start, 'HH24:MI') AS "quietStart", to_char(p.quiet_end, 'HH24:MI') AS "quietEnd",
            (SELECT time_zone FROM network_settings WHERE id = 1) AS "timeZone"
       FROM stranded_nodes sn JOIN nodes n ON n.id = sn.node_id JOIN sites s ON s.id = n.site_id
       JOIN users u ON u.id = s.host_user_id JOIN alert_preferences p ON p.user_id = u.id
      WHERE sn.outage_id = $1 AND sn.ended_at IS NULL AND sn.released_at IS NULL AND u.active AND p.upstream_notices
      ORDER BY u.id, n.name`,
    { bind: [outageId], type: QueryTypes.SELECT, transaction },
  );
  let written = 0;
  for (const h of hosts) {
    if (told.has(h.userId)) continue;
    const timeZone = h.timeZone ?? 'UTC';
    const footer = footerLinks(config, h.userId, now);
    const rendered = hostUpstream(
      {
        recipientName: h.name,
        nodeName: h.nodeName,
        siteName: h.siteName,
        since: new Date(outage.startedAt),
        timeZone,
        recoveryUrl: recoveryUrl(config, h.userId, outageId, now),
      },
      footer,
    );
    if (
      await enqueue(
        sequelize,
        {
          kind: 'upstream-notice',
          userId: h.userId,
          address: h.email,
          name: h.name,
          outageId,
          dedupeKey: `upstream:${outageId}:${h.userId}`,
          rendered,
          unsubscribeUrl: footer.unsubscribeUrl,
          notBefore: quietUntil(now, timeZone, h.quietStart, h.quietEnd),
        },
        now,
        transaction,
      )
    )
      written++;
  }
  return written;
}

/** One `self-check` per admin when the cut contains Parapet's own side (an uplink went silent with what hangs off it). */
export async function writePartitionNotice(sequelize: Sequelize, config: Config, uplinkIds: number[], nodeCount: number, now: Date, transaction: Transaction) {
  if (!uplinkIds.length) return 0;
  const uplinks = await sequelize.query<{ name: string }>('SELECT name FROM nodes WHERE id = ANY($1::int[]) ORDER BY name', {
    bind: [uplinkIds],
    type: QueryTypes.SELECT,
    transaction,
  });
  const admins = await sequelize.query<{ id: number; name: string; email: string; timeZone: string | null }>(
    `SELECT u.id, u.name, u.email, (SELECT time_zone FROM network_settings WHERE id = 1) AS "timeZone"
       FROM users u LEFT JOIN alert_preferences p ON p.user_id = u.id
      WHERE u.role = 'admin' AND u.active AND coalesce(p.admin_self_check, true) ORDER BY u.id`,
    { type: QueryTypes.SELECT, transaction },
  );
  let written = 0;
  for (const a of admins) {
    const footer = footerLinks(config, a.id, now);
    const rendered = partitionNotice(
      { recipientName: a.name, uplinkNames: uplinks.map((u) => u.name), nodeCount, since: now, timeZone: a.timeZone ?? 'UTC', consoleUrl: consoleUrl(config) },
      footer,
    );
    const key = `partition:${[...uplinkIds].sort((x, y) => x - y).join(',')}:${now.toISOString()}:${a.id}`;
    if (
      await enqueue(
        sequelize,
        { kind: 'self-check', userId: a.id, address: a.email, name: a.name, dedupeKey: key, rendered, unsubscribeUrl: footer.unsubscribeUrl },
        now,
        transaction,
      )
    )
      written++;
  }
  return written;
}
