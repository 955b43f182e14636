import { useSearchParams } from 'react-router-dom';
import { reportMonth } from '../app/page-data';
import { PageHeader, Section } from '../components/page-header';
import { LoadError, Loading } from '../components/query-state';
import { LazyTimeChart } from '../components/lazy-time-chart';
import { reportCsvUrl, useAvailabilityReport } from '../features/reports/api/reports';
import { AvailabilityTable, OutagesTable } from '../features/reports/components/report-tables';
import { buttonClass } from '../components/button';
import { formatPercent } from '../lib/format';

const thisMonth = () => new Date().toISOString().slice(0, 7);

export function ReportsPage() {
  const [search, setSearch] = useSearchParams();
  const month = reportMonth(search);
  const report = useAvailabilityReport(month);
  const r = report.data;

  return (
    <>
      <PageHeader
        title="Availability report"
        subtitle="How much of a month each neighbourhood and node was up, and how fast outages were handled."
        actions={
          <>
            <a className={buttonClass('secondary')} href={reportCsvUrl(month, 'availability')} download>
              Availability CSV
            </a>
            <a className={buttonClass('secondary')} href={reportCsvUrl(month, 'outages')} download>
              Outages CSV
            </a>
          </>
        }
      />
      <label className="mb-4 inline-block text-sm font-medium">
        Month
        <input
          type="month"
          value={month}
          max={thisMonth()}
          onChange={(e) => e.target.value && setSearch({ month: e.target.value })}
          className="mt-1 block rounded-md border border-line-strong bg-surface px-2 py-1"
        />
      </label>
      {report.isPending ? (
        <Loading label="Working out the month…" />
      ) : report.isError ? (
        <LoadError error={report.error} />
      ) : (
        r && (
          <>
            <p className="text-sm" data-testid="report-overall">
              Overall <strong>{formatPercent(r.overall.availabilityPct)}</strong> up, {r.overall.outageCount} outages. Month boundaries are midnight in{' '}
              {r.timeZone}; time is counted from when each node was first heard from.
            </p>
            <Section title="Day by day">
              <LazyTimeChart
                label={`Availability per day in ${month}`}
                unit="%"
                times={r.days.map((d) => Date.parse(`${d.date}T12:00:00Z`) / 1000)}
                lines={[{ label: 'Availability', colour: '--pp-state-online', values: r.days.map((d) => d.availabilityPct) }]}
              />
            </Section>
            <Section title="By neighbourhood">
              <AvailabilityTable rows={r.neighbourhoods} label="Availability by neighbourhood" />
            </Section>
            <Section title="By node">
              <AvailabilityTable rows={r.nodes} label="Availability by node" withNeighbourhood />
            </Section>
            <Section title="Outages">
              <p className="mb-2 text-xs text-muted">Times to acknowledge and to recover are counted from the moment the outage began.</p>
              <OutagesTable outages={r.outages} />
            </Section>
          </>
        )
      )}
    </>
  );
}
