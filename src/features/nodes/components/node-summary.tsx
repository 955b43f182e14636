import type { NodeDto } from '../../../../shared/schemas/node';
import { Details } from '../../../components/details';
import { StateBadge } from '../../../components/state-badge';
import { formatDateTime, formatSince } from '../../../lib/format';

export function NodeSummary({ node, siteName, neighbourhoodName }: { node: NodeDto; siteName: string; neighbourhoodName: string }) {
  return (
    <Details
      items={[
        { label: 'State', value: <StateBadge state={node.state} /> },
        { label: 'Why', value: node.healthReason ?? (node.lastSeenAt ? '—' : 'Has not reported yet') },
        { label: 'In this state since', value: node.stateSince ? formatDateTime(node.stateSince) : '—' },
        { label: 'Last report', value: node.lastSeenAt ? `${formatSince(node.lastSeenAt)} (${formatDateTime(node.lastSeenAt)})` : 'Never reported' },
        { label: 'Site', value: siteName },
        { label: 'Neighbourhood', value: neighbourhoodName },
        { label: 'Report interval', value: `${node.reportIntervalS} s` },
        { label: 'Hardware', value: node.hardware ?? '—' },
        { label: 'Firmware', value: node.firmware ?? '—' },
        { label: 'Management address', value: node.managementAddress ? <code>{node.managementAddress}</code> : '—' },
        { label: 'Uplink', value: node.isUplink ? 'Yes — carries the shared connection' : 'No' },
      ]}
    />
  );
}
