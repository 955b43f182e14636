import type { AvailabilityReportDto } from '../../../../shared/schemas/report';
import { formatDateTime, formatDuration, formatPercent } from '../../../lib/format';

const th = 'px-2 py-1.5 font-medium';
const td = 'px-2 py-1.5';

export function AvailabilityTable({
  rows,
  label,
  withNeighbourhood = false,
}: {
  rows: (AvailabilityReportDto['nodes'][number] | AvailabilityReportDto['neighbourhoods'][number])[];
  label: string;
  withNeighbourhood?: boolean;
}) {
  return (
    <div className="overflow-x-auto rounded-md border border-line">
      <table className="w-full text-left text-sm" aria-label={label}>
        <thead className="bg-sunken text-muted">
          <tr>
            <th className={th}>Name</th>
            {withNeighbourhood && <th className={th}>Neighbourhood</th>}
            <th className={`${th} text-right`}>Availability</th>
            <th className={`${th} text-right`}>Down for</th>
            <th className={`${th} text-right`}>Outages</th>
          </tr>
        </thead>
        <tbody>
          {rows.map((r) => (
            <tr key={r.id} className="border-t border-line">
              <td className={td}>{r.name}</td>
              {withNeighbourhood && <td className={td}>{'neighbourhood' in r ? r.neighbourhood : ''}</td>}
              <td className={`${td} text-right tabular-nums`}>{formatPercent(r.availabilityPct)}</td>
              <td className={`${td} text-right tabular-nums`}>{r.downS ? formatDuration(r.downS) : '—'}</td>
              <td className={`${td} text-right tabular-nums`}>{r.outageCount}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

export function OutagesTable({ outages }: { outages: AvailabilityReportDto['outages'] }) {
  if (outages.length === 0) return <p className="text-sm text-muted">No outages this month.</p>;
  return (
    <div className="overflow-x-auto rounded-md border border-line">
      <table className="w-full text-left text-sm" aria-label="Outages this month">
        <thead className="bg-sunken text-muted">
          <tr>
            <th className={th}>Node</th>
            <th className={th}>Neighbourhood</th>
            <th className={th}>Started</th>
            <th className={`${th} text-right`}>Acknowledged after</th>
            <th className={`${th} text-right`}>Recovered after</th>
          </tr>
        </thead>
        <tbody>
          {outages.map((o) => (
            <tr key={o.id} className="border-t border-line">
              <td className={td}>{o.node}</td>
              <td className={td}>{o.neighbourhood}</td>
              <td className={td}>{formatDateTime(o.startedAt)}</td>
              <td className={`${td} text-right tabular-nums`}>{o.timeToAcknowledgeS === null ? 'not yet' : formatDuration(o.timeToAcknowledgeS)}</td>
              <td className={`${td} text-right tabular-nums`}>{o.timeToRecoverS === null ? 'still down' : formatDuration(o.timeToRecoverS)}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
