import { Link } from 'react-router-dom';
import { PageHeader, Section } from '../components/page-header';
import { LoadError, Loading } from '../components/query-state';
import { useOverview } from '../features/overview/api/overview';
import { AirSummary } from '../features/overview/components/air-summary';
import { DriftNodes } from '../features/overview/components/drift-nodes';
import { WeakestLinks } from '../features/overview/components/weakest-links';
import { OpenOutages } from '../features/overview/components/open-outages';
import { StateCounts } from '../features/overview/components/state-counts';
import { Totals } from '../features/overview/components/totals';
import { paths } from '../lib/paths';

export function OverviewPage() {
  const overview = useOverview();

  return (
    <>
      <PageHeader title="Overview" subtitle="The part of the network you look after, at a glance. Figures update as nodes report." />
      {overview.isPending && <Loading label="Loading the overview…" />}
      {overview.isError && <LoadError error={overview.error} />}
      {overview.data && (
        <>
          <Section
            title="Nodes by state"
            actions={
              <Link to={paths.topology.to()} className="text-sm font-medium text-accent hover:underline">
                See them on the network map
              </Link>
            }
          >
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
          <div className="grid gap-x-6 lg:grid-cols-2">
            <Section
              title="Open outages"
              actions={
                <Link to={paths.outages.to({ status: 'open' })} className="text-sm font-medium text-accent hover:underline">
                  All outages
                </Link>
              }
            >
              <OpenOutages outages={overview.data.openOutages} />
            </Section>
            <Section title="Nodes that drift from the inventory">
              <DriftNodes nodes={overview.data.driftNodes} />
            </Section>
            {((overview.data.silentLinks?.length ?? 0) > 0 || (overview.data.radioMoves?.length ?? 0) > 0 || (overview.data.discoveredLinkCount ?? 0) > 0) && (
              <Section title="The air and the inventory disagree">
                <AirSummary overview={overview.data} />
              </Section>
            )}
            {overview.data.weakestLinks.length > 0 && (
              <Section title="Weakest links">
                <WeakestLinks links={overview.data.weakestLinks} />
              </Section>
            )}
          </div>
        </>
      )}
    </>
  );
}
