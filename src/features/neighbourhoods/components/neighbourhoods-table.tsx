import { Link } from 'react-router-dom';
import type { NeighbourhoodDto } from '../../../../shared/schemas/neighbourhood';
import { DataTable, type Column } from '../../../components/data-table';
import { paths } from '../../../lib/paths';

export const NEIGHBOURHOOD_SORT_FIELDS = [{ key: 'name', label: 'Name' }];

export function NeighbourhoodsTable({ neighbourhoods, sort, onSort }: { neighbourhoods: NeighbourhoodDto[]; sort?: string; onSort: (sort: string) => void }) {
  const columns: Column<NeighbourhoodDto>[] = [
    {
      key: 'name',
      header: 'Name',
      sortKey: 'name',
      render: (n) => (
        <>
          <Link to={paths.neighbourhoodDetail.to(n.id)} className="font-medium text-accent hover:underline">
            {n.name}
          </Link>
          {n.retiredAt && <span className="ml-2 rounded border border-line px-1.5 text-xs text-muted">Retired</span>}
        </>
      ),
    },
    { key: 'sites', header: 'Sites', align: 'right', render: (n) => n.siteCount },
    { key: 'nodes', header: 'Nodes', align: 'right', render: (n) => n.nodeCount },
    { key: 'operators', header: 'Operators', align: 'right', render: (n) => n.operatorIds.length },
    { key: 'description', header: 'Description', render: (n) => <span className="line-clamp-2 text-muted">{n.description ?? '—'}</span> },
  ];
  return (
    <DataTable
      testId="neighbourhoods-table"
      caption="Neighbourhoods"
      rows={neighbourhoods}
      columns={columns}
      rowKey={(n) => n.id}
      sort={sort}
      onSort={onSort}
    />
  );
}
