import { ListBody } from '../components/list-body';
import { FilterSelect, sortChoices } from '../components/list-toolbar';
import { PageHeader } from '../components/page-header';
import { useNeighbourhoods } from '../features/neighbourhoods/api/neighbourhoods';
import { useOutages } from '../features/outages/api/outages';
import { OUTAGE_SORT_FIELDS, OutagesTable } from '../features/outages/components/outages-table';
import { useListParams } from '../lib/list-params';
import { outageList } from '../app/page-data';
import { ALL_BY_NAME, nameLookup, toOptions } from '../lib/resource';

const STATUS_OPTIONS = [
  { value: 'open', label: 'Open' },
  { value: 'closed', label: 'Closed' },
];

export function OutagesPage() {
  const list = useListParams(outageList.filters, outageList.sort);
  const outages = useOutages(list.apiParams);
  const neighbourhoods = useNeighbourhoods(ALL_BY_NAME);
  const filtered = Boolean(list.filters.status || list.filters.neighbourhoodId || list.filters.nodeId);
  const nodeName = list.filters.nodeId ? outages.data?.data[0]?.nodeName : undefined;

  return (
    <>
      <PageHeader title="Outages" subtitle="When nodes went down, for how long, and who is on it. New outages appear as they open." />
      <div className="mb-3 flex flex-wrap items-end gap-3">
        <FilterSelect
          label="Status"
          value={list.filters.status}
          onChange={(status) => list.update({ status })}
          options={STATUS_OPTIONS}
          allLabel="Open and closed"
        />
        <FilterSelect
          label="Neighbourhood"
          value={list.filters.neighbourhoodId}
          onChange={(neighbourhoodId) => list.update({ neighbourhoodId })}
          options={toOptions(neighbourhoods.data?.data)}
        />
        <div className="sm:hidden">
          <FilterSelect
            label="Sort by"
            value={list.sort}
            onChange={(sort) => list.update({ sort })}
            options={sortChoices(OUTAGE_SORT_FIELDS)}
            allLabel="Newest first"
          />
        </div>
        {list.filters.nodeId && (
          <p className="pb-1.5 text-sm">
            Only {nodeName ?? `node #${list.filters.nodeId}`}.{' '}
            <button type="button" className="font-medium text-accent hover:underline" onClick={() => list.update({ nodeId: undefined })}>
              Show every node
            </button>
          </p>
        )}
      </div>
      <ListBody
        query={outages}
        noun="outages"
        emptyTitle={filtered ? 'No outages match' : 'No outages recorded'}
        emptyHint={filtered ? 'Try another status or neighbourhood.' : 'An outage opens when a node misses its reports, and closes when it is back.'}
        onPage={(page) => list.update({ page })}
        onPageSize={(pageSize) => list.update({ pageSize })}
      >
        {(rows) => (
          <OutagesTable outages={rows} neighbourhoodNames={nameLookup(neighbourhoods.data?.data)} sort={list.sort} onSort={(sort) => list.update({ sort })} />
        )}
      </ListBody>
    </>
  );
}
