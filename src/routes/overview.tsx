import { NotYetReporting } from '../components/details';
import { EmptyState } from '../components/empty-state';
import { PageHeader, Section } from '../components/page-header';
import { LoadError, Loading } from '../components/query-state';
import { useOverview } from '../features/overview/api/overview';
import { StateCounts } from '../features/overview/components/state-counts';
import { Totals } from '../features/overview/components/totals';
import { paths } from '../lib/paths';

export function OverviewPage() {
  const overview = useOverview();

  return (
    <>
      <PageHeader title="Overview" subtitle="The part of the network you look after, at a glance." />
      {overview.isPending && <Loading label="Loading the overview…" />}
      {overview.isError && <LoadError error={overview.error} />}
      {overview.data && (
        <>
          <Section title="Nodes by state">
            <StateCounts counts={overview.data.countsByState} />
          </Section>
          <div className="mt-6">
            <Totals
              totals={[
                { label: 'Nodes', value: overview.data.nodeCount, to: paths.nodes.to() },
                { label: 'Sites', value: overview.data.siteCount, to: paths.sites.to() },
                { label: 'Neighbourhoods', value: overview.data.neighbourhoodCount, to: paths.neighbourhoods.to() },
              ]}
            />
          </div>
          <Section title="Open outages">
            {overview.data.openOutages.length === 0 ? (
              <EmptyState title="No open outages" />
            ) : (
              <NotYetReporting title={`${overview.data.openOutages.length} open outage${overview.data.openOutages.length === 1 ? '' : 's'}`}>
                The outage list with each outage's blast radius comes with outage tracking.
              </NotYetReporting>
            )}
          </Section>
        </>
      )}
      <Section title="Live figures">
        <div className="grid gap-3 md:grid-cols-2">
          <NotYetReporting title="Throughput and latency">Live figures appear once nodes report.</NotYetReporting>
          <NotYetReporting title="Network map">Sites placed by their coordinates, with their links, appear once nodes report.</NotYetReporting>
        </div>
      </Section>
    </>
  );
}
