import { useMemo, useState } from 'react';
import { EmptyState } from '../../../components/empty-state';
import { LoadError, Loading } from '../../../components/query-state';
import { TimeChart, type ChartLine } from '../../../components/time-chart';
import { SERIES_RANGES, useNodeSeries, type SeriesPoint, type SeriesRange } from '../api/telemetry';

const RANGE_WORDS: Record<SeriesRange, string> = { '24h': '24 hours', '7d': '7 days', '30d': '30 days' };

interface ChartSpec {
  title: string;
  unit: string;
  lines: { label: string; colour: ChartLine['colour']; field: keyof Omit<SeriesPoint, 't'>; dashed?: boolean }[];
}

// Calm colours of their own, so a chart line is never read as a node state.
const CHARTS: ChartSpec[] = [
  {
    title: 'Signal and noise',
    unit: 'dBm',
    lines: [
      { label: 'Signal (average)', colour: '--pp-series-signal', field: 'signalAvgDbm' },
      { label: 'Signal (weakest)', colour: '--pp-series-signal-weak', field: 'signalMinDbm', dashed: true },
      { label: 'Noise (average)', colour: '--pp-series-noise', field: 'noiseAvgDbm' },
    ],
  },
  { title: 'Signal-to-noise ratio', unit: 'dB', lines: [{ label: 'SNR (average)', colour: '--pp-series-snr', field: 'snrAvgDb' }] },
  { title: 'Throughput', unit: 'Mbps', lines: [{ label: 'Throughput (average)', colour: '--pp-series-throughput', field: 'throughputAvgMbps' }] },
  { title: 'Latency', unit: 'ms', lines: [{ label: 'Latency (average)', colour: '--pp-series-latency', field: 'latencyAvgMs' }] },
];

function describe(spec: ChartSpec, points: SeriesPoint[], range: SeriesRange): string {
  const values = points.map((p) => p[spec.lines[0].field]).filter((v): v is number => typeof v === 'number');
  if (values.length === 0) return `${spec.title} over ${RANGE_WORDS[range]}: no figures.`;
  const latest = values[values.length - 1];
  const [lowest, highest] = [Math.min(...values).toFixed(1), Math.max(...values).toFixed(1)];
  return `${spec.title} over ${RANGE_WORDS[range]}: latest ${latest.toFixed(1)} ${spec.unit}, lowest ${lowest}, highest ${highest}.`;
}

export function RangeSwitch({ range, onChange }: { range: SeriesRange; onChange: (range: SeriesRange) => void }) {
  return (
    <div role="group" aria-label="Time range" className="inline-flex rounded-md border border-line-strong bg-surface p-0.5">
      {SERIES_RANGES.map((option) => (
        <button
          key={option}
          type="button"
          aria-pressed={option === range}
          onClick={() => onChange(option)}
          className={`rounded px-2.5 py-1 text-sm ${option === range ? 'bg-accent text-accent-ink' : 'text-muted hover:bg-sunken hover:text-ink'}`}
        >
          {RANGE_WORDS[option]}
        </button>
      ))}
    </div>
  );
}

/** Signal, noise, SNR, throughput and latency from the roll-ups, over a chosen range. */
export function NodeCharts({ nodeId }: { nodeId: number }) {
  const [range, setRange] = useState<SeriesRange>('24h');
  const series = useNodeSeries(nodeId, range);
  const points = series.data?.points;
  const times = useMemo(() => (points ?? []).map((p) => Date.parse(p.t) / 1000), [points]);
  const lineSets = useMemo(
    () =>
      CHARTS.map((spec): ChartLine[] =>
        spec.lines.map((line) => ({ label: line.label, colour: line.colour, dashed: line.dashed, values: (points ?? []).map((p) => p[line.field]) })),
      ),
    [points],
  );

  return (
    <div data-testid="node-charts">
      <div className="mb-3 flex flex-wrap items-center justify-between gap-2">
        <RangeSwitch range={range} onChange={setRange} />
        {series.data && (
          <p className="text-xs text-muted">
            One point per {series.data.bucketS >= 3600 ? `${series.data.bucketS / 3600} h` : `${series.data.bucketS / 60} min`}
          </p>
        )}
      </div>
      {series.isPending ? (
        <Loading label="Loading figures…" />
      ) : series.isError ? (
        <LoadError error={series.error} />
      ) : series.data.points.length === 0 ? (
        <EmptyState title={`No figures for the last ${RANGE_WORDS[range]} yet`}>
          Charts fill in as the node reports: reports are summed up into points once a minute.
        </EmptyState>
      ) : (
        <div className={`grid gap-3 md:grid-cols-2 ${series.isPlaceholderData ? 'opacity-70' : ''}`}>
          {CHARTS.map((spec, i) => (
            <figure key={spec.title} className="min-w-0 rounded-lg border border-line bg-surface p-3">
              <figcaption className="mb-1 text-sm font-medium">{spec.title}</figcaption>
              <TimeChart times={times} lines={lineSets[i]} unit={spec.unit} label={describe(spec, series.data.points, range)} />
            </figure>
          ))}
        </div>
      )}
    </div>
  );
}
