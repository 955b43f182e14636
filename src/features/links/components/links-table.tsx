import { Link } from 'react-router-dom';
import type { LinkDto } from '../../../../shared/schemas/link';
import { DataTable, type Column } from '../../../components/data-table';
import { paths } from '../../../lib/paths';

interface LinksTableProps {
  links: LinkDto[];
  /** The node whose page this is; the table names the far end. */
  nodeId: number;
  nodeNames: Map<number, string>;
}

export function LinksTable({ links, nodeId, nodeNames }: LinksTableProps) {
  const farEnd = (link: LinkDto) => (link.nodeAId === nodeId ? link.nodeBId : link.nodeAId);
  const columns: Column<LinkDto>[] = [
    { key: 'name', header: 'Link', render: (link) => link.name ?? `Link #${link.id}` },
    {
      key: 'farEnd',
      header: 'Far end',
      render: (link) => (
        <Link to={paths.nodeDetail.to(farEnd(link))} className="text-accent hover:underline">
          {nodeNames.get(farEnd(link)) ?? `Node #${farEnd(link)}`}
        </Link>
      ),
    },
    { key: 'radios', header: 'Radios', render: (link) => `#${link.radioAId} ↔ #${link.radioBId}` },
    { key: 'status', header: 'Status', render: (link) => (link.status === 'live' ? 'Live' : 'Planned') },
  ];
  return <DataTable caption="Links" rows={links} columns={columns} rowKey={(link) => link.id} />;
}
