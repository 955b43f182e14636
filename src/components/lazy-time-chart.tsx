import { lazy, Suspense, type ComponentProps } from 'react';

const TimeChart = lazy(() => import('./time-chart').then((m) => ({ default: m.TimeChart })));

/**
 * A TimeChart whose drawing library (uPlot, about 22 KB with its styles) loads after the page's first draw. Until it
 * arrives its place is held at the chart's height under the same accessible name, so nothing below it moves.
 */
export function LazyTimeChart(props: ComponentProps<typeof TimeChart>) {
  return (
    <Suspense fallback={<div role="img" aria-label={props.label} className="w-full min-w-0" style={{ minHeight: props.heightPx ?? 180 }} />}>
      <TimeChart {...props} />
    </Suspense>
  );
}
