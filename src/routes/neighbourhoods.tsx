import { useNavigate } from 'react-router-dom';
import { Button } from '../components/button';
import { ListBody } from '../components/list-body';
import { FilterSelect, ListToolbar, sortChoices } from '../components/list-toolbar';
import { PageHeader } from '../components/page-header';
import { useNeighbourhoods } from '../features/neighbourhoods/api/neighbourhoods';
import { NeighbourhoodForm } from '../features/neighbourhoods/components/neighbourhood-form';
import { NEIGHBOURHOOD_SORT_FIELDS, NeighbourhoodsTable } from '../features/neighbourhoods/components/neighbourhoods-table';
import { useListParams } from '../lib/list-params';
import { neighbourhoodList, neighbourhoodListParams } from '../app/page-data';
import { paths } from '../lib/paths';
import { useInlineForm } from '../lib/use-inline-form';

export function NeighbourhoodsPage() {
  const navigate = useNavigate();
  const list = useListParams(neighbourhoodList.filters, neighbourhoodList.sort);
  // This page shows retired neighbourhoods too unless asked not to; pickers elsewhere get only active ones.
  const neighbourhoods = useNeighbourhoods(neighbourhoodListParams(list.apiParams));
  const adding = useInlineForm();

  return (
    <>
      <PageHeader
        title="Neighbourhoods"
        subtitle="Parts of the network, each with its sites, nodes and operators on the rota."
        actions={
          neighbourhoods.data?.abilities?.create &&
          !adding.open && (
            <Button {...adding.triggerProps} variant="primary" onClick={adding.show}>
              Add neighbourhood
            </Button>
          )
        }
      />
      {adding.open && (
        <div {...adding.regionProps} className="mb-6">
          <h2 className="mb-2 text-lg font-semibold">New neighbourhood</h2>
          <NeighbourhoodForm onSaved={(n) => navigate(paths.neighbourhoodDetail.to(n.id))} onCancel={adding.hide} />
        </div>
      )}
      <ListToolbar
        q={list.q}
        onSearch={(q) => list.update({ q }, { replace: true })}
        searchLabel="Search neighbourhoods"
        sortOptions={sortChoices(NEIGHBOURHOOD_SORT_FIELDS)}
        sort={list.sort}
        onSort={(sort) => list.update({ sort })}
      >
        <FilterSelect
          label="Showing"
          value={list.filters.retired}
          onChange={(retired) => list.update({ retired })}
          options={[
            { value: 'false', label: 'Active only' },
            { value: 'true', label: 'Retired only' },
          ]}
        />
      </ListToolbar>
      <ListBody
        query={neighbourhoods}
        noun="neighbourhoods"
        emptyTitle={list.q ? 'No neighbourhoods match' : 'No neighbourhoods yet'}
        emptyHint={list.q ? 'Try a shorter search.' : 'Neighbourhoods you look after will be listed here.'}
        onPage={(page) => list.update({ page })}
        onPageSize={(pageSize) => list.update({ pageSize })}
      >
        {(rows) => <NeighbourhoodsTable neighbourhoods={rows} sort={list.sort} onSort={(sort) => list.update({ sort })} />}
      </ListBody>
    </>
  );
}
