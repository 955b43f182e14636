import type { ReactNode } from 'react';
import { Link } from 'react-router-dom';
import type { LinkDto } from '../../../../shared/schemas/link';
import { DataTable, type Column } from '../../../components/data-table';
import { paths } from '../../../lib/paths';

interface LinksTableProps {
  links: LinkDto[];
  /** The node whose page this is; the table names the far end. */
  nodeId: number;
  nodeNames: Map<number, string>;
  /** Edit and remove buttons for a row, where the caller may use them. */
  actions?: (link: LinkDto) => ReactNode;
}

export function LinksTable({ links, nodeId, nodeNames, actions }: LinksTableProps) {
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
    ...(actions ? [{ key: 'actions', header: 'Actions', render: actions }] : []),
  ];
  return <DataTable caption="Links" testId="links-table" rows={links} columns={columns} rowKey={(link) => link.id} />;
}
