import { useMemo } from 'react';
import { LoadError } from '../../../components/query-state';
import { TimeChart } from '../../../components/time-chart';
import { formatFigure } from '../../../lib/format';
import { useNodeSeries, type SeriesPoint } from '../api/telemetry';

const LINES: { title: string; unit: string; field: keyof Omit<SeriesPoint, 't'>; colour: `--pp-${string}` }[] = [
  { title: 'Signal', unit: 'dBm', field: 'signalAvgDbm', colour: '--pp-series-signal' },
  { title: 'Throughput', unit: 'Mbps', field: 'throughputAvgMbps', colour: '--pp-series-throughput' },
  { title: 'Latency', unit: 'ms', field: 'latencyAvgMs', colour: '--pp-series-latency' },
];

/** The last 24 hours at a glance, small enough for a side panel. */
export function NodeSparklines({ nodeId }: { nodeId: number }) {
  const series = useNodeSeries(nodeId, '24h');
  const points = series.data?.points;
  const times = useMemo(() => (points ?? []).map((p) => Date.parse(p.t) / 1000), [points]);
  const lines = useMemo(() => LINES.map((l) => [{ label: l.title, colour: l.colour, values: (points ?? []).map((p) => p[l.field]) }]), [points]);

  if (series.isError) return <LoadError error={series.error} />;
  if (!points) return <p className="text-sm text-muted">Loading the last 24 hours…</p>;
  if (points.length === 0) return <p className="text-sm text-muted">No figures for the last 24 hours yet; they are summed up once a minute.</p>;
  return (
    <ul className="space-y-2" data-testid="node-sparklines">
      {LINES.map((line, i) => {
        const values = lines[i][0].values.filter((v): v is number => typeof v === 'number');
        const latest = values.length ? values[values.length - 1] : null;
        return (
          <li key={line.title}>
            <p className="flex justify-between text-xs text-muted">
              <span>{line.title}, 24 h</span>
              <span className="tabular-nums">{formatFigure(latest, line.unit)}</span>
            </p>
            <TimeChart
              sparkline
              heightPx={36}
              times={times}
              lines={lines[i]}
              unit={line.unit}
              label={`${line.title} over the last 24 hours, latest ${formatFigure(latest, line.unit)}`}
            />
          </li>
        );
      })}
    </ul>
  );
}
