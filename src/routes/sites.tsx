import { ButtonLink } from '../components/button';
import { ListBody } from '../components/list-body';
import { FilterSelect, ListToolbar, sortChoices } from '../components/list-toolbar';
import { PageHeader } from '../components/page-header';
import { ExportButton } from '../features/csv/components/export-button';
import { useNeighbourhoods } from '../features/neighbourhoods/api/neighbourhoods';
import { useSites } from '../features/sites/api/sites';
import { SITE_SORT_FIELDS, SitesTable } from '../features/sites/components/sites-table';
import { useListParams } from '../lib/list-params';
import { siteList } from '../app/page-data';
import { paths } from '../lib/paths';
import { ALL_BY_NAME, nameLookup, toOptions } from '../lib/resource';

export function SitesPage() {
  const list = useListParams(siteList.filters, siteList.sort);
  const sites = useSites(list.apiParams);
  const neighbourhoods = useNeighbourhoods(ALL_BY_NAME);
  const filtered = Boolean(list.q || list.filters.neighbourhoodId || list.filters.hostUserId);

  return (
    <>
      <PageHeader
        title="Sites"
        subtitle="Roofs, windows and balconies that carry a node."
        actions={
          <>
            <ExportButton table="sites" />
            {sites.data?.abilities?.create && (
              <>
                <ButtonLink to={paths.imports.to('sites')}>Import CSV</ButtonLink>
                <ButtonLink to={paths.siteNew.to()} variant="primary">
                  Add site
                </ButtonLink>
              </>
            )}
          </>
        }
      />
      <ListToolbar
        q={list.q}
        onSearch={(q) => list.update({ q }, { replace: true })}
        searchLabel="Search sites"
        sortOptions={sortChoices(SITE_SORT_FIELDS)}
        sort={list.sort}
        onSort={(sort) => list.update({ sort })}
      >
        <FilterSelect
          label="Neighbourhood"
          value={list.filters.neighbourhoodId}
          onChange={(neighbourhoodId) => list.update({ neighbourhoodId })}
          options={toOptions(neighbourhoods.data?.data)}
        />
      </ListToolbar>
      <ListBody
        query={sites}
        noun="sites"
        emptyTitle={filtered ? 'No sites match' : 'No sites yet'}
        emptyHint={filtered ? 'Try a shorter search or another neighbourhood.' : 'Sites you can see will be listed here.'}
        onPage={(page) => list.update({ page })}
        onPageSize={(pageSize) => list.update({ pageSize })}
      >
        {(rows) => (
          <SitesTable sites={rows} neighbourhoodNames={nameLookup(neighbourhoods.data?.data)} sort={list.sort} onSort={(sort) => list.update({ sort })} />
        )}
      </ListBody>
    </>
  );
}
