// Replays the demo's past through the live rules with the clock set back: the silence check opens
// outages, strands nodes and writes the mail; a node's first report back closes its outage through
// ingest; operators acknowledge and annotate as the outage page does; a host announces maintenance.
import { QueryTypes, type Sequelize } from 'sequelize';
import type { Config } from '../config';
import { runAlertSweep } from '../jobs/alertSweep';
import { runSilenceCheck } from '../jobs/silenceCheck';
import { MaintenanceWindow, Outage } from '../models';
import { ingestReports } from '../services/heartbeatIngest';
import type { TokenNode } from '../services/ingestTokens';
import type { HistoryPlan, PlannedOutage } from './demoHistoryPlan';
import { silences } from './demoHistoryPlan';
import type { ReportSpecs } from './demoHistoryReports';

const MIN_MS = 60_000;
const plus = (d: Date, ms: number) => new Date(d.getTime() + ms);

/**
 * The outbox sender's part, with a mail server that took everything: what was due by `at` went out
 * then. (Mail still waiting at a node's return is withdrawn by the live rules, as it would be.)
 */
export async function deliverDue(sequelize: Sequelize, at: Date) {
  await sequelize.query(
    `UPDATE outbox SET status = 'sent', attempts = 1, sent_at = greatest(next_attempt_at, created_at), updated_at = $1
      WHERE status = 'pending' AND next_attempt_at <= $1`,
    { bind: [at] },
  );
}

interface Step {
  at: Date;
  order: number;
  run: () => Promise<void>;
}

export async function tokenNode(sequelize: Sequelize, nodeId: number): Promise<TokenNode> {
  const [row] = await sequelize.query<TokenNode>(
    `SELECT n.id AS "nodeId", n.neighbourhood_id AS "neighbourhoodId", s.host_user_id AS "hostUserId", n.state, n.health_streak AS "healthStreak",
            n.last_seq::text AS "lastSeq", n.report_interval_s AS "reportIntervalS", n.thresholds, n.firmware
       FROM nodes n JOIN sites s ON s.id = n.site_id WHERE n.id = $1`,
    { bind: [nodeId], type: QueryTypes.SELECT },
  );
  return row;
}

/** One report as the node's agent would send it at `at`: predicted signals, the drifting link `driftDb` off. */
export function reportAt(specs: ReportSpecs, nodeId: number, at: Date, driftDb = 0) {
  const node = specs.nodes.find((n) => n.nodeId === nodeId)!;
  return {
    seq: Math.floor(at.getTime() / MIN_MS),
    sentAt: at.toISOString(),
    uptimeS: 120,
    load1: 0.4,
    memFreeKb: 31_000,
    firmware: node.firmware ?? undefined,
    throughputMbps: 42,
    latencyMs: 14,
    radios: specs.radios
      .filter((r) => r.nodeId === nodeId)
      .map((r) => ({
        iface: r.iface,
        role: r.role as 'access-point',
        band: r.band as '5',
        channel: r.channel,
        channelWidthMHz: r.width as 20,
        ssid: r.ssid ?? undefined,
        signalDbm: Math.round(((r.baseSignalDbm ?? -64) + (r.drifts ? driftDb : 0)) * 10) / 10,
        noiseDbm: -95,
        txRateMbps: r.role === 'access-point' ? 72 : 150,
        rxRateMbps: r.role === 'access-point' ? 65 : 135,
        clients: r.role === 'access-point' ? 2 + (nodeId % 7) : undefined,
      })),
  };
}

/**
 * Walks the plan in time order. Before each silence check, every node that the plan has reporting
 * at that moment is marked as heard from a few seconds earlier (its history rows are already stored),
 * and each silent node as last heard at its real last stored report, so the check judges exactly
 * the silences of the plan.
 */
export async function replayHistory(sequelize: Sequelize, config: Config, plan: HistoryPlan, specs: ReportSpecs, people: Map<string, number>) {
  const id = (node: string) => {
    const found = specs.ids.get(node);
    if (found === undefined) throw new Error(`the demo history names ${node}, which the scenario does not have`);
    return found;
  };
  const quiet = [...silences(plan)].flatMap(([node, spans]) => spans.map((s) => ({ nodeId: id(node), ...s })));
  const steps: Step[] = [];
  const add = (at: Date, order: number, run: () => Promise<void>) => steps.push({ at, order, run });

  const check = (at: Date) =>
    add(at, 1, async () => {
      const silentNow = quiet.filter((q) => q.after < at && at <= q.until);
      await sequelize.query(
        `UPDATE nodes SET last_seen_at = $1, last_seq = floor(extract(epoch FROM $1::timestamptz) / 60)::bigint WHERE NOT (id = ANY($2::int[]))`,
        { bind: [plus(at, -20_000), silentNow.map((q) => q.nodeId)] },
      );
      for (const q of silentNow) {
        await sequelize.query(
          `UPDATE nodes SET (last_seen_at, last_seq) =
           (SELECT max(received_at), max(seq) FROM heartbeats WHERE node_id = $1 AND received_at <= $2)
         WHERE id = $1`,
          { bind: [q.nodeId, q.after] },
        );
      }
      // The check has been running all along: no "Parapet was not watching" notice for the replay's jumps.
      await sequelize.query(`UPDATE job_state SET last_run_at = $1 WHERE name = 'silence-check'`, { bind: [plus(at, -config.healthCheckIntervalMs)] });
      await runSilenceCheck(sequelize, config, at, config.healthCheckIntervalMs, config.rootCauseWindowS);
      await runAlertSweep(sequelize, config, at);
      await deliverDue(sequelize, at);
    });
  const back = (node: string, at: Date) =>
    add(at, 2, async () => {
      await deliverDue(sequelize, at);
      await ingestReports(sequelize, config, await tokenNode(sequelize, id(node)), [reportAt(specs, id(node), at)], at);
      await deliverDue(sequelize, at);
    });
  const annotate = (o: PlannedOutage) => {
    const update = async (at: Date, fields: Record<string, unknown>) => {
      const outage = await Outage.findOne({ where: { nodeId: id(o.node) }, order: [['startedAt', 'DESC']] });
      if (!outage || outage.startedAt > at) throw new Error(`the demo history expected an outage of ${o.node} by ${at.toISOString()}`);
      await outage.update({ ...fields, updatedAt: at });
    };
    if (o.ack) add(o.ack.at, 3, () => update(o.ack!.at, { acknowledgedAt: o.ack!.at, acknowledgedBy: people.get(o.ack!.by) ?? null }));
    if (o.notes) add(plus(o.backAt, 10 * MIN_MS), 3, () => update(plus(o.backAt, 10 * MIN_MS), { notes: o.notes }));
  };
  const outage = (o: PlannedOutage, behind: string[] = []) => {
    // Past the offline window (three missed reports) of every node that fell quiet (the last of them a minute later).
    const windowS = Math.max(...[o.node, ...behind].map((n) => 3 * specs.nodes.find((x) => x.nodeId === id(n))!.intervalS));
    check(plus(o.lastReportAt, (windowS + (behind.length ? 90 : 20)) * 1000));
    back(o.node, o.backAt);
    annotate(o);
    // Reminders for outages left unacknowledged, as the sweep would send them while they last.
    for (let t = o.lastReportAt.getTime() + 30 * MIN_MS; t < o.backAt.getTime(); t += 30 * MIN_MS) {
      add(new Date(t), 0, async () => {
        await runAlertSweep(sequelize, config, new Date(t));
        await deliverDue(sequelize, new Date(t));
      });
    }
    if (behind.length) {
      for (const q of quiet.filter((x) => behind.map(id).includes(x.nodeId) && x.after.getTime() === o.lastReportAt.getTime())) {
        const name = [...specs.ids].find(([, v]) => v === q.nodeId)![0];
        back(name, q.until);
      }
      check(plus(o.backAt, 5 * MIN_MS)); // releases the stranded rows
    }
  };

  for (const o of [...plan.outages, ...plan.flaps]) outage(o);
  outage(plan.backhaulFailure, plan.backhaulFailure.behind);

  const m = plan.maintenance;
  add(m.announcedAt, 0, async () => {
    await MaintenanceWindow.create({
      nodeId: id(m.node),
      startsAt: m.startsAt,
      endsAt: m.endsAt,
      reason: m.reason,
      createdBy: people.get(m.announcedBy) ?? null,
      createdAt: m.announcedAt,
      updatedAt: m.announcedAt,
    });
  });
  check(plus(m.startsAt, MIN_MS));
  back(m.node, m.silentUntil);
  check(plus(m.endsAt, MIN_MS));

  steps.sort((a, b) => a.at.getTime() - b.at.getTime() || a.order - b.order);
  await sequelize.query(
    `INSERT INTO job_state (name, last_run_at, watching_since) VALUES ('silence-check', $1, $1)
     ON CONFLICT (name) DO UPDATE SET last_run_at = $1, watching_since = $1`,
    { bind: [plan.start] },
  );
  for (const step of steps) await step.run();
  return steps.length;
}
