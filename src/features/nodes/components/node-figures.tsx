import type { NodeDto } from '../../../../shared/schemas/node';
import { DataTable, type Column } from '../../../components/data-table';
import { EmptyState } from '../../../components/empty-state';
import { formatDateTime, formatDuration, formatFigure, formatSince } from '../../../lib/format';
import { clockTroubleText } from '../../../../shared/health/clock';
import { lastReportOf, type ReportedRadio } from '../api/telemetry';

function Figure({ label, value }: { label: string; value: string }) {
  return (
    <div className="min-w-0 rounded-lg border border-line bg-surface px-3 py-2">
      <dt className="text-xs font-medium tracking-wide text-muted uppercase">{label}</dt>
      <dd className="mt-0.5 text-lg font-semibold tabular-nums">{value}</dd>
    </div>
  );
}

/** The newest report's key figures; a node that never reported says so instead of showing zeros. */
export function LatestFigures({ node, compact = false }: { node: NodeDto; compact?: boolean }) {
  const report = lastReportOf(node);
  if (!report) return <EmptyState title="No report yet">Figures appear with the node's first heartbeat.</EmptyState>;
  return (
    <div data-testid="latest-figures">
      <dl className={`grid gap-2 ${compact ? 'grid-cols-2' : 'grid-cols-2 sm:grid-cols-3 lg:grid-cols-6'}`}>
        <Figure label="Signal" value={formatFigure(report.signalDbm, 'dBm', 0)} />
        <Figure label="SNR" value={formatFigure(report.snrDb, 'dB', 0)} />
        <Figure label="Throughput" value={formatFigure(report.throughputMbps, 'Mbps')} />
        <Figure label="Latency" value={formatFigure(report.latencyMs, 'ms')} />
        {!compact && <Figure label="Uptime" value={formatDuration(report.uptimeS)} />}
        {!compact && <Figure label="Firmware" value={report.firmware ?? '—'} />}
      </dl>
      <p className="mt-2 text-xs text-muted">
        Received {formatSince(report.receivedAt)}
        {report.receivedAt && ` (${formatDateTime(report.receivedAt)})`}
        {report.seq !== null && `, report no. ${report.seq}`}
      </p>
      {report.clockTrouble && (
        <p role="note" data-testid="clock-trouble" className="mt-2 rounded-md border border-caution/40 bg-caution-soft px-3 py-2 text-sm">
          <strong className="font-semibold">Clock trouble: </strong>
          {clockTroubleText(report.clockTrouble.kind, report.clockTrouble.reportedSentAt)} Parapet keeps its reports and uses its own receive time instead.
          Check that the router sets its clock from a time server (NTP) after it starts.
        </p>
      )}
    </div>
  );
}

const radioColumns: Column<ReportedRadio>[] = [
  { key: 'iface', header: 'Interface', render: (r) => <code>{r.iface}</code> },
  {
    key: 'channel',
    header: 'Channel',
    render: (r) => (r.channel === undefined ? '—' : `${r.channel}${r.channelWidthMHz ? ` (${r.channelWidthMHz} MHz)` : ''}`),
  },
  { key: 'ssid', header: 'SSID', render: (r) => r.ssid ?? '—' },
  { key: 'signal', header: 'Signal', align: 'right', render: (r) => formatFigure(r.signalDbm, 'dBm', 0) },
  { key: 'noise', header: 'Noise', align: 'right', render: (r) => formatFigure(r.noiseDbm, 'dBm', 0) },
  { key: 'rates', header: 'Rate tx / rx', align: 'right', render: (r) => `${formatFigure(r.txRateMbps, 'Mbps')} / ${formatFigure(r.rxRateMbps, 'Mbps')}` },
  { key: 'clients', header: 'Clients', align: 'right', render: (r) => (r.clients === undefined ? '—' : String(r.clients)) },
];

export function ReportedRadios({ node }: { node: NodeDto }) {
  const radios = lastReportOf(node)?.radios ?? [];
  if (radios.length === 0) return null;
  return <DataTable caption="Radios as last reported" rows={radios} columns={radioColumns} rowKey={(r) => r.iface} />;
}

const show = (value: unknown) => (value === null || value === undefined || value === '' ? '(none)' : String(value));

/** Settings the node reports that differ from the inventory: what to fix on the roof or in the record. */
export function DriftList({ node }: { node: NodeDto }) {
  if (!node.lastReport) return <EmptyState title="Nothing to compare yet">Drift is checked against each report once the node reports.</EmptyState>;
  if (node.drift.length === 0) return <p className="text-sm text-muted">The node runs what the inventory says.</p>;
  return (
    <ul data-testid="drift-list" className="divide-y divide-line rounded-lg border border-line bg-surface text-sm">
      {node.drift.map((item) => (
        <li key={item.field} className="flex flex-wrap items-baseline justify-between gap-x-4 gap-y-1 px-3 py-2">
          <code className="font-medium">{item.field}</code>
          <span>
            inventory <strong className="font-semibold">{show(item.expected)}</strong>, node reports{' '}
            <strong className="font-semibold">{show(item.reported)}</strong>
          </span>
        </li>
      ))}
    </ul>
  );
}
