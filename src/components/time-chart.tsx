import { useEffect, useMemo, useRef } from 'react';
import uPlot from 'uplot';
import 'uplot/dist/uPlot.min.css';
import { useIsDark } from '../lib/theme';

export interface ChartLine {
  label: string;
  /** A colour token from src/styles.css (`--pp-series-signal`), read in the current theme. */
  colour: `--pp-${string}`;
  values: (number | null)[];
  dashed?: boolean;
}

interface TimeChartProps {
  /** Bucket start times, Unix seconds. */
  times: number[];
  lines: ChartLine[];
  /** The unit shown on the value axis and in the legend, e.g. "dBm". */
  unit: string;
  heightPx?: number;
  /** A tiny chart without axes, legend or cursor, for the graph's side panel. */
  sparkline?: boolean;
  /** What a screen reader hears instead of the picture. */
  label: string;
}

// A canvas cannot use var(): the raw token's value in the current theme (src/styles.css, :root and .dark).
function themeColour(name: `--pp-${string}`): string {
  return getComputedStyle(document.documentElement).getPropertyValue(name).trim() || 'gray';
}

// With only a few buckets a line is a dot or two: draw the points so a new node's first figures show.
const FEW_POINTS = 24;

function optionsFor(props: TimeChartProps, widthPx: number): uPlot.Options {
  const { lines, unit, heightPx = 180, sparkline = false } = props;
  const fewPoints = props.times.length < FEW_POINTS;
  const muted = themeColour('--pp-muted');
  const grid = themeColour('--pp-line');
  const format = (_u: uPlot, value: number | null) => (value === null || value === undefined ? '—' : `${Number(value.toFixed(1))} ${unit}`);
  return {
    width: widthPx,
    height: heightPx,
    // Room on the right for the last time label, which uPlot centres on its tick.
    padding: sparkline ? [2, 2, 2, 2] : [12, 24, 0, 0],
    legend: { show: !sparkline },
    cursor: sparkline ? { show: false } : { drag: { x: false, y: false } },
    scales: { x: { time: true } },
    axes: sparkline
      ? [{ show: false }, { show: false }]
      : [
          { stroke: muted, grid: { stroke: grid, width: 1 }, ticks: { stroke: grid } },
          { stroke: muted, grid: { stroke: grid, width: 1 }, ticks: { stroke: grid }, size: 56, label: unit, labelSize: 16 },
        ],
    series: [
      {},
      ...lines.map((line) => ({
        label: line.label,
        stroke: themeColour(line.colour),
        width: sparkline ? 1.5 : 2,
        dash: line.dashed ? [5, 4] : undefined,
        value: format,
        spanGaps: false,
        points: { show: fewPoints, size: sparkline ? 4 : 6, fill: themeColour(line.colour) },
      })),
    ],
  };
}

/**
 * A uPlot time series that follows its container's width. Gaps (buckets with no report)
 * stay gaps: a line drawn across them would claim figures nobody measured.
 */
export function TimeChart(props: TimeChartProps) {
  const { times, lines, label, heightPx = 180 } = props;
  const box = useRef<HTMLDivElement>(null);
  const plot = useRef<uPlot | null>(null);
  const data = useMemo<uPlot.AlignedData>(() => [times, ...lines.map((line) => line.values)], [times, lines]);
  // The chart is rebuilt only when its shape changes (lines, unit, size); new figures go through setData.
  const dark = useIsDark();
  const lineShape = lines.map((l) => `${l.label}|${l.colour}|${l.dashed}`).join(',');
  const shape = `${dark}|${lineShape}|${props.unit}|${heightPx}|${props.sparkline}|${times.length < FEW_POINTS}`;

  useEffect(() => {
    const element = box.current;
    if (!element) return;
    const chart = new uPlot(optionsFor(props, Math.max(element.clientWidth, 120)), data, element);
    plot.current = chart;
    const observer = new ResizeObserver(() => chart.setSize({ width: Math.max(element.clientWidth, 120), height: heightPx }));
    observer.observe(element);
    return () => {
      observer.disconnect();
      chart.destroy();
      plot.current = null;
    };
    // eslint-disable-next-line react-hooks/exhaustive-deps -- rebuilt on shape only; data is applied below
  }, [shape]);

  useEffect(() => {
    plot.current?.setData(data);
  }, [data]);

  return <div ref={box} role="img" aria-label={label} className="w-full min-w-0" />;
}
