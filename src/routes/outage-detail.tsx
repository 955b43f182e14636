import { Link, useParams } from 'react-router-dom';
import type { TimelineEntryDto } from '../../shared/schemas/outage';
import { PageHeader, Section } from '../components/page-header';
import { LoadError, Loading } from '../components/query-state';
import { useOutage } from '../features/outages/api/outages';
import { Acknowledgement, BlastRadius } from '../features/outages/components/outages-table';
import { OutageNotes } from '../features/outages/components/outage-notes';
import { formatDateTime, formatDuration } from '../lib/format';
import { paths } from '../lib/paths';

const KIND_WORD: Record<TimelineEntryDto['kind'], string> = {
  opened: 'Went down',
  acknowledged: 'Acknowledged',
  note: 'Note',
  'host-step': 'Host step',
  closed: 'Back',
};

/** One outage: what happened, in order, including what the host tried; new steps appear without a reload. */
export function OutageDetailPage() {
  const id = Number(useParams().outageId);
  const outage = useOutage(id);
  const o = outage.data;
  return (
    <>
      <PageHeader
        title={o ? `Outage of ${o.nodeName}` : 'Outage'}
        subtitle={
          o
            ? o.endedAt
              ? `Down for ${formatDuration(o.durationS)}, from ${formatDateTime(o.startedAt)}`
              : `Down since ${formatDateTime(o.startedAt)}`
            : undefined
        }
        actions={
          o && (
            <Link to={paths.nodeDetail.to(o.nodeId)} className="text-sm font-medium text-accent hover:underline">
              The node
            </Link>
          )
        }
      />
      {outage.isPending && <Loading label="Loading the outage…" />}
      {outage.isError && <LoadError error={outage.error} />}
      {o && (
        <>
          <div className="flex flex-wrap gap-x-8 gap-y-2 text-sm">
            <div>
              <span className="text-muted">Acknowledged: </span>
              <Acknowledgement outage={o} />
            </div>
            <BlastRadius outage={o} />
          </div>
          <Section title="Timeline">
            <ol data-testid="outage-timeline" aria-live="polite" className="divide-y divide-line rounded-lg border border-line bg-surface text-sm">
              {(o.timeline ?? []).map((e, i) => (
                <li key={`${e.at}-${i}`} className="grid gap-1 px-3 py-2 sm:grid-cols-[11rem_7rem_1fr]" data-kind={e.kind}>
                  <time dateTime={e.at} className="text-muted">
                    {formatDateTime(e.at)}
                  </time>
                  <span className={e.kind === 'host-step' ? 'font-semibold' : 'text-muted'}>{KIND_WORD[e.kind]}</span>
                  <span className="break-words">{e.text}</span>
                </li>
              ))}
            </ol>
          </Section>
          <Section title="Notes">
            <OutageNotes outage={o} />
          </Section>
        </>
      )}
    </>
  );
}
