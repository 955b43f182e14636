import { QueryTypes, type Sequelize } from 'sequelize';
import { type HostStep, hostStepText } from '../../shared/health/hostSteps';
import type { TimelineEntryDto } from '../../shared/schemas/outage';
import { formatDuration } from '../mail/templates/compose';
import type { Outage } from '../models';
import { Conflict } from '../errors';
import { domainEvents } from './events';

/** Enough for any real attempt; a cap keeps a leaked link from filling the timeline. */
export const MAX_STEPS_PER_OUTAGE = 100;

interface StepRow {
  at: Date;
  step: HostStep;
  note: string | null;
  byUserId: number | null;
  byName: string | null;
  byHost: boolean;
}

const stepEntry = (r: StepRow): TimelineEntryDto => ({
  at: new Date(r.at).toISOString(),
  kind: 'host-step',
  step: r.step,
  byUserId: r.byUserId,
  text: hostStepText(r.step, r.byName ? `${r.byName}${r.byHost ? ' (host)' : ''}` : 'Someone', r.note),
});

/** What happened during an outage, oldest first: opened, acknowledged, notes, the host's steps, closed. */
export async function timelineOf(sequelize: Sequelize, o: Outage): Promise<TimelineEntryDto[]> {
  const steps = await sequelize.query<StepRow>(
    `SELECT s.at, s.step, s.note, s.by_user_id AS "byUserId", u.name AS "byName", coalesce(u.id = st.host_user_id, false) AS "byHost"
       FROM outage_host_steps s LEFT JOIN users u ON u.id = s.by_user_id
       JOIN outages o ON o.id = s.outage_id JOIN nodes n ON n.id = o.node_id JOIN sites st ON st.id = n.site_id
      WHERE s.outage_id = $1 ORDER BY s.at, s.id`,
    { bind: [o.id], type: QueryTypes.SELECT },
  );
  const entries: TimelineEntryDto[] = [{ at: o.startedAt.toISOString(), kind: 'opened', text: `${o.node?.name ?? 'The node'} stopped answering` }];
  if (o.acknowledgedAt) {
    entries.push({
      at: o.acknowledgedAt.toISOString(),
      kind: 'acknowledged',
      byUserId: o.acknowledgedBy ?? null,
      text: `Acknowledged${o.acknowledger ? ` by ${o.acknowledger.name}` : ''}`,
    });
  }
  // Notes are one text kept on the outage; they sit at their last change.
  if (o.notes) entries.push({ at: o.updatedAt.toISOString(), kind: 'note', text: o.notes });
  entries.push(...steps.map(stepEntry));
  if (o.endedAt)
    entries.push({
      at: o.endedAt.toISOString(),
      kind: 'closed',
      text: `Back online after ${formatDuration((o.endedAt.getTime() - o.startedAt.getTime()) / 1000)}`,
    });
  const order = (e: TimelineEntryDto) => (e.kind === 'opened' ? 0 : e.kind === 'closed' ? 2 : 1);
  return entries.sort((a, b) => order(a) - order(b) || a.at.localeCompare(b.at));
}

/** Records one step the host took, and tells the operators' open pages at once. */
export async function recordHostStep(
  sequelize: Sequelize,
  o: Pick<Outage, 'id' | 'nodeId'> & { node?: { neighbourhoodId: number } | null },
  by: { id: number; name: string },
  input: { step: HostStep; note?: string },
  hostUserId: number | null,
  now: Date,
): Promise<TimelineEntryDto> {
  const note = input.note ? input.note : null;
  const [{ n }] = await sequelize.query<{ n: number }>('SELECT count(*)::int AS n FROM outage_host_steps WHERE outage_id = $1', {
    bind: [o.id],
    type: QueryTypes.SELECT,
  });
  if (n >= MAX_STEPS_PER_OUTAGE)
    throw Conflict(`This outage already has ${MAX_STEPS_PER_OUTAGE} recorded steps. Add anything more as a note, or write to the operators.`);
  await sequelize.query('INSERT INTO outage_host_steps (outage_id, step, note, by_user_id, at) VALUES ($1, $2, $3, $4, $5)', {
    bind: [o.id, input.step, note, by.id, now],
  });
  const entry = stepEntry({ at: now, step: input.step, note, byUserId: by.id, byName: by.name, byHost: by.id === hostUserId });
  domainEvents.emit('outage-timeline', {
    outageId: o.id,
    nodeId: o.nodeId,
    neighbourhoodId: o.node!.neighbourhoodId,
    hostUserId,
    at: entry.at,
    kind: 'host-step',
  });
  return entry;
}
