import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import type { Config } from '../config';
import { type LinkPurpose, signLink } from '../mail/signedLinks';
import type { FooterLinks } from '../mail/templates/compose';
import type { LastFigures } from '../mail/templates/operator';

export type Audience = 'operator' | 'host' | 'admin';

export interface Recipient {
  userId: number;
  name: string;
  email: string;
  audience: Audience;
  operatorMode: 'immediate' | 'hourly' | 'off';
  quietStart: string | null;
  quietEnd: string | null;
}

interface CandidateRow extends Recipient {
  hostMail: boolean;
  adminNodeMail: boolean;
}

const mailOn = (c: CandidateRow) => (c.audience === 'operator' ? c.operatorMode !== 'off' : c.audience === 'host' ? c.hostMail : c.adminNodeMail);

/**
 * Who hears about a node: the operators assigned to its neighbourhood, the host of its site, and
 * admins who opted in; never anyone else. One entry per person, in the first of those roles whose
 * mail they have switched on (an operator who also hosts gets the operator version).
 */
export async function nodeAudience(sequelize: Sequelize, nodeId: number, transaction?: Transaction): Promise<Recipient[]> {
  const rows = await sequelize.query<CandidateRow>(
    `WITH n AS (SELECT n.neighbourhood_id, s.host_user_id FROM nodes n JOIN sites s ON s.id = n.site_id WHERE n.id = $1),
     cand AS (
       SELECT oa.user_id AS id, 'operator' AS audience, 1 AS rank FROM operator_assignments oa JOIN n ON oa.neighbourhood_id = n.neighbourhood_id
       UNION ALL SELECT n.host_user_id, 'host', 2 FROM n WHERE n.host_user_id IS NOT NULL
       UNION ALL SELECT u.id, 'admin', 3 FROM users u WHERE u.role = 'admin')
     SELECT u.id AS "userId", u.name, u.email, c.audience,
            coalesce(p.operator_mode, 'immediate') AS "operatorMode", coalesce(p.host_mail, true) AS "hostMail",
            coalesce(p.admin_node_mail, false) AS "adminNodeMail",
            to_char(p.quiet_start, 'HH24:MI') AS "quietStart", to_char(p.quiet_end, 'HH24:MI') AS "quietEnd"
       FROM cand c JOIN users u ON u.id = c.id LEFT JOIN alert_preferences p ON p.user_id = u.id
      WHERE u.active AND (c.audience <> 'operator' OR u.role = 'operator')
      ORDER BY u.id, c.rank`,
    { bind: [nodeId], type: QueryTypes.SELECT, transaction },
  );
  const chosen = new Map<number, Recipient>();
  for (const r of rows) {
    if (chosen.has(r.userId) || !mailOn(r)) continue;
    chosen.set(r.userId, {
      userId: r.userId,
      name: r.name,
      email: r.email,
      audience: r.audience,
      operatorMode: r.operatorMode,
      quietStart: r.quietStart,
      quietEnd: r.quietEnd,
    });
  }
  return [...chosen.values()];
}

export interface NodeContext {
  nodeId: number;
  nodeName: string;
  neighbourhoodId: number;
  neighbourhoodName: string;
  siteName: string;
  hostName: string | null;
  state: string;
  lastSeenAt: Date | null;
  lastReport: LastFigures | null;
  timeZone: string;
  neighbours: { name: string; state: string }[];
  operators: { name: string; email: string }[];
}

/** Everything the templates say about a node, read inside the deciding transaction. */
export async function nodeContext(sequelize: Sequelize, nodeId: number, transaction?: Transaction): Promise<NodeContext | null> {
  const opts = { bind: [nodeId], type: QueryTypes.SELECT as const, transaction };
  const [node] = await sequelize.query<Omit<NodeContext, 'neighbours' | 'operators'>>(
    `SELECT n.id AS "nodeId", n.name AS "nodeName", n.neighbourhood_id AS "neighbourhoodId", h.name AS "neighbourhoodName",
            s.name AS "siteName", hu.name AS "hostName", n.state, n.last_seen_at AS "lastSeenAt", n.last_report AS "lastReport",
            (SELECT time_zone FROM network_settings WHERE id = 1) AS "timeZone"
       FROM nodes n JOIN sites s ON s.id = n.site_id JOIN neighbourhoods h ON h.id = n.neighbourhood_id
       LEFT JOIN users hu ON hu.id = s.host_user_id
      WHERE n.id = $1`,
    opts,
  );
  if (!node) return null;
  const neighbours = await sequelize.query<{ name: string; state: string }>(
    `SELECT DISTINCT o.name, o.state FROM links l
       JOIN radios ra ON ra.id = l.radio_a_id JOIN radios rb ON rb.id = l.radio_b_id
       JOIN nodes o ON o.id = CASE WHEN ra.node_id = $1 THEN rb.node_id ELSE ra.node_id END
      WHERE (ra.node_id = $1 OR rb.node_id = $1) AND o.id <> $1 ORDER BY o.name`,
    opts,
  );
  const operators = await sequelize.query<{ name: string; email: string }>(
    `SELECT u.name, u.email FROM operator_assignments oa JOIN users u ON u.id = oa.user_id
      WHERE oa.neighbourhood_id = (SELECT neighbourhood_id FROM nodes WHERE id = $1) AND u.active AND u.role = 'operator'
      ORDER BY u.name`,
    opts,
  );
  return { ...node, timeZone: node.timeZone ?? 'UTC', lastSeenAt: node.lastSeenAt ? new Date(node.lastSeenAt) : null, neighbours, operators };
}

function signedUrl(config: Config, purpose: LinkPurpose, userId: number, outageId: number, now: Date) {
  const expiresAtS = Math.floor(now.getTime() / 1000) + config.mailLinkDays * 86_400;
  const token = signLink(config.sessionSecret, { purpose, userId, outageId, expiresAtS });
  return `${config.publicUrl.replace(/\/$/, '')}/api/v1/mail-links/${purpose}?t=${token}`;
}

export const footerLinks = (config: Config, userId: number, now: Date): FooterLinks => ({
  preferencesUrl: signedUrl(config, 'preferences', userId, 0, now),
  unsubscribeUrl: signedUrl(config, 'unsubscribe', userId, 0, now),
});
export const acknowledgeUrl = (config: Config, userId: number, outageId: number, now: Date) => signedUrl(config, 'acknowledge', userId, outageId, now);
export const nodeUrl = (config: Config, nodeId: number) => `${config.publicUrl.replace(/\/$/, '')}/nodes/${nodeId}`;
export const consoleUrl = (config: Config) => `${config.publicUrl.replace(/\/$/, '')}/`;

/** The host's phone page for one outage: a short-lived link that works without a password. */
export function recoveryUrl(config: Config, userId: number, outageId: number, now: Date) {
  const expiresAtS = Math.floor(now.getTime() / 1000) + config.recoveryLinkHours * 3600;
  const token = signLink(config.sessionSecret, { purpose: 'recover', userId, outageId, expiresAtS });
  return `${config.publicUrl.replace(/\/$/, '')}/recover?t=${token}`;
}
