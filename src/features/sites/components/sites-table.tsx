import { Link } from 'react-router-dom';
import type { SiteDto } from '../../../../shared/schemas/site';
import { DataTable, type Column } from '../../../components/data-table';
import { paths } from '../../../lib/paths';

interface SitesTableProps {
  sites: SiteDto[];
  neighbourhoodNames: Map<number, string>;
  sort?: string;
  onSort?: (sort: string) => void;
}

export const SITE_SORT_FIELDS = [
  { key: 'name', label: 'Name' },
  { key: 'antennaHeightM', label: 'Antenna height' },
];

export function SitesTable({ sites, neighbourhoodNames, sort, onSort }: SitesTableProps) {
  const columns: Column<SiteDto>[] = [
    {
      key: 'name',
      header: 'Name',
      sortKey: 'name',
      render: (site) => (
        <Link to={paths.siteDetail.to(site.id)} className="font-medium text-accent hover:underline">
          {site.name}
        </Link>
      ),
    },
    { key: 'neighbourhood', header: 'Neighbourhood', render: (site) => neighbourhoodNames.get(site.neighbourhoodId) ?? `#${site.neighbourhoodId}` },
    {
      key: 'position',
      header: 'Position',
      render: (site) => (
        <span className="tabular-nums">
          {site.latitude.toFixed(5)}, {site.longitude.toFixed(5)}
        </span>
      ),
    },
    { key: 'antennaHeightM', header: 'Antenna height', sortKey: 'antennaHeightM', align: 'right', render: (site) => `${site.antennaHeightM} m` },
    { key: 'host', header: 'Host', render: (site) => site.host?.name ?? (site.hostUserId ? 'Hosted' : '—') },
  ];
  return <DataTable testId="sites-table" caption="Sites" rows={sites} columns={columns} rowKey={(site) => site.id} sort={sort} onSort={onSort} />;
}
