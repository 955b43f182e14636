import { QueryTypes, type Sequelize } from 'sequelize';
import { pathNodes } from '../../shared/health/paths';
import type { NodeState } from '../../shared/enums';
import type { RecoveryDto } from '../../shared/schemas/recovery';
import type { Config } from '../config';
import { ApiError } from '../errors';
import { formatDuration } from '../mail/templates/compose';
import { type LinkClaims, verifyLink } from '../mail/signedLinks';
import { Node, Outage, User } from '../models';
import { isHostOfNode, loadActor, type Actor } from '../policies/actor';
import { timelineOf } from './outageTimeline';
import { currentTopology } from './topologyGraph';

export interface RecoveryContext {
  claims: LinkClaims;
  actor: Actor;
  outage: Outage;
  /** The host's own node: the outage's node, or theirs cut off behind it. */
  nodeId: number;
  /** The failed node further up when the cause is not at the host's place. */
  upstreamNodeId: number | null;
}

const gone = (message: string) => new ApiError(404, 'not_found', message);

/**
 * Checks a recovery link: genuine and unexpired (400/410), its person still active, its outage
 * still recorded (404), and the person still the host of the node concerned (403).
 */
export async function recoveryContext(sequelize: Sequelize, config: Config, token: unknown): Promise<RecoveryContext> {
  const claims = verifyLink(config.sessionSecret, token, 'recover', config.now());
  const actor = await loadActor(claims.userId);
  if (!actor) throw gone('The person this link was sent to no longer has an active account.');
  const outage = await Outage.findByPk(claims.outageId, {
    include: [
      { model: Node, as: 'node', required: true },
      { model: User, as: 'acknowledger', required: false },
    ],
  });
  if (!outage) throw gone('This outage is no longer recorded. If your node is still down, write to the operators of your neighbourhood.');
  if (isHostOfNode(actor, outage.node!)) {
    return { claims, actor, outage, nodeId: outage.nodeId, upstreamNodeId: await failedUpstreamOf(sequelize, outage.nodeId) };
  }
  // A host whose node is cut off behind this outage's node: the cause is there, not at their place.
  const [behind] = await sequelize.query<{ nodeId: number }>(
    `SELECT sn.node_id AS "nodeId" FROM stranded_nodes sn JOIN nodes n ON n.id = sn.node_id
      WHERE sn.outage_id = $1 AND n.site_id = ANY($2::int[]) ORDER BY sn.ended_at IS NULL DESC, sn.id LIMIT 1`,
    { bind: [outage.id, actor.hostedSiteIds], type: QueryTypes.SELECT },
  );
  if (behind) return { claims, actor, outage, nodeId: behind.nodeId, upstreamNodeId: outage.nodeId };
  throw new ApiError(
    403,
    'forbidden',
    'You no longer host the node this link is about, so it cannot be used. Ask the operators of your neighbourhood if you need help.',
  );
}

/** The failed node nearest the uplink on the node's path, if one is down now (offline with an open outage). */
async function failedUpstreamOf(sequelize: Sequelize, nodeId: number): Promise<number | null> {
  const topology = await currentTopology(sequelize);
  const upstream = pathNodes(topology.paths, nodeId).slice(1);
  if (!upstream.length) return null;
  const down = await sequelize.query<{ id: number }>(
    `SELECT n.id FROM nodes n JOIN outages o ON o.node_id = n.id AND o.ended_at IS NULL WHERE n.id = ANY($1::int[]) AND n.state = 'offline'`,
    { bind: [upstream], type: QueryTypes.SELECT },
  );
  const ids = new Set(down.map((d) => d.id));
  return [...upstream].reverse().find((id) => ids.has(id)) ?? null;
}

const localTime = (at: Date, timeZone: string) => {
  try {
    return new Intl.DateTimeFormat('en-GB', { hour: '2-digit', minute: '2-digit', timeZone }).format(at);
  } catch {
    return new Intl.DateTimeFormat('en-GB', { hour: '2-digit', minute: '2-digit', timeZone: 'UTC' }).format(at);
  }
};

/** What the host's page shows. */
export async function recoveryView(sequelize: Sequelize, config: Config, ctx: RecoveryContext): Promise<RecoveryDto> {
  const [node] = await sequelize.query<{
    id: number;
    name: string;
    state: NodeState;
    lastSeenAt: Date | null;
    siteName: string;
    neighbourhoodName: string;
    neighbourhoodId: number;
    timeZone: string | null;
  }>(
    `SELECT n.id, n.name, n.state, n.last_seen_at AS "lastSeenAt", s.name AS "siteName", h.name AS "neighbourhoodName", h.id AS "neighbourhoodId",
            (SELECT time_zone FROM network_settings WHERE id = 1) AS "timeZone"
       FROM nodes n JOIN sites s ON s.id = n.site_id JOIN neighbourhoods h ON h.id = n.neighbourhood_id WHERE n.id = $1`,
    { bind: [ctx.nodeId], type: QueryTypes.SELECT },
  );
  const [upstream] = ctx.upstreamNodeId
    ? await sequelize.query<{ nodeName: string; siteName: string }>(
        'SELECT n.name AS "nodeName", s.name AS "siteName" FROM nodes n JOIN sites s ON s.id = n.site_id WHERE n.id = $1',
        { bind: [ctx.upstreamNodeId], type: QueryTypes.SELECT },
      )
    : [];
  const operators = await sequelize.query<{ name: string }>(
    `SELECT u.name FROM operator_assignments oa JOIN users u ON u.id = oa.user_id
      WHERE oa.neighbourhood_id = $1 AND u.active AND u.role = 'operator' ORDER BY u.name`,
    { bind: [node.neighbourhoodId], type: QueryTypes.SELECT },
  );
  const o = ctx.outage;
  const timeZone = node.timeZone ?? 'UTC';
  const who = operators.length
    ? operators.map((p) => p.name).join(' or ')
    : `the network's coordinators (no operator is assigned to ${node.neighbourhoodName} yet)`;
  const whatNext = o.endedAt
    ? 'Nothing more is needed from you.'
    : o.acknowledger
      ? `${o.acknowledger.name} took this on at ${localTime(o.acknowledgedAt!, timeZone)}. If the steps did not help, they will get in touch with you to arrange a visit; please leave everything plugged in until then.`
      : `The volunteers for ${node.neighbourhoodName} (${who}) were told when it stopped, and are reminded every ${formatDuration(config.reminderIntervalS)} until one of them takes it on. That person will get in touch with you to arrange a visit; please leave everything plugged in until then.`;
  const steps = (await timelineOf(sequelize, o)).filter((e) => e.kind === 'host-step');
  return {
    outageId: o.id,
    node: { id: node.id, name: node.name, state: node.state, lastSeenAt: node.lastSeenAt ? new Date(node.lastSeenAt).toISOString() : null },
    siteName: node.siteName,
    neighbourhoodName: node.neighbourhoodName,
    startedAt: o.startedAt.toISOString(),
    endedAt: o.endedAt ? o.endedAt.toISOString() : null,
    upstream: upstream ?? null,
    steps,
    whatNext,
    operators,
    acknowledgedBy: o.acknowledger?.name ?? null,
    linkExpiresAt: new Date(ctx.claims.expiresAtS * 1000).toISOString(),
  };
}
