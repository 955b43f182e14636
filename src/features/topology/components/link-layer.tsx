import { useStore, useStoreApi, ViewportPortal } from '@xyflow/react';
import { memo, useMemo } from 'react';
import { DISCOVERED_COLOUR, DISCOVERED_DASH, MARGIN_MARK, marginColour, plannedDash } from '../utils/link-look';
import type { LinkLine } from '../utils/flow-elements';

interface Rect {
  minX: number;
  minY: number;
  maxX: number;
  maxY: number;
}

// Which part of the graph is in view, coarsely: the key changes only after a pan of half a screen
// or a zoom step of √2, so panning does not re-render three thousand lines on every frame.
function viewCell(s: { transform: [number, number, number]; width: number; height: number }): string {
  const [tx, ty, zoom] = s.transform;
  const stepPx = Math.max(s.width, s.height, 1) / zoom / 2;
  return `${Math.floor(-tx / zoom / stepPx)},${Math.floor(-ty / zoom / stepPx)},${Math.round(Math.log2(zoom) * 2)}`;
}

/** The view in graph coordinates, widened by a screen on each side so lines are ready before they scroll in. */
function visibleRect(s: { transform: [number, number, number]; width: number; height: number }): Rect {
  const [tx, ty, zoom] = s.transform;
  const width = Math.max(s.width, 1) / zoom;
  const height = Math.max(s.height, 1) / zoom;
  const x = -tx / zoom;
  const y = -ty / zoom;
  return { minX: x - width, minY: y - height, maxX: x + 2 * width, maxY: y + 2 * height };
}

const crosses = (line: LinkLine, r: Rect) => line.maxX >= r.minX && line.minX <= r.maxX && line.maxY >= r.minY && line.minY <= r.maxY;

// Scaled like the nodes, so the mark stays readable when the graph is zoomed out.
const MARK_R = 6.5;

/** The band's sign in a disc at the middle of the line. */
function MarginMark({ line }: { line: LinkLine }) {
  const colour = marginColour(line.band);
  return (
    <g
      data-testid={`topology-link-mark-${line.id}`}
      style={{ transform: `translate(${(line.x1 + line.x2) / 2}px, ${(line.y1 + line.y2) / 2}px) scale(var(--pp-node-scale, 1))` }}
    >
      <circle r={MARK_R} fill="var(--pp-surface)" stroke={colour} strokeWidth={1.5} />
      <text textAnchor="middle" dominantBaseline="central" fontSize={10} fontWeight={700} fill={colour}>
        {MARGIN_MARK[line.band]}
      </text>
    </g>
  );
}

/**
 * Links as plain lines under the nodes, drawn from the layout's own coordinates: no per-link
 * handles to measure, and only the lines near the view are in the page.
 */
export const LinkLayer = memo(function LinkLayer({ lines }: { lines: LinkLine[] }) {
  const cell = useStore(viewCell);
  const store = useStoreApi();
  // eslint-disable-next-line react-hooks/exhaustive-deps -- the cell key stands for the view
  const shown = useMemo(() => lines.filter((line) => crosses(line, visibleRect(store.getState()))), [lines, cell, store]);
  return (
    <ViewportPortal>
      <svg aria-hidden="true" width="1" height="1" overflow="visible" style={{ position: 'absolute', left: 0, top: 0, zIndex: -1, pointerEvents: 'none' }}>
        {shown.map((line) => (
          <line
            key={line.id}
            data-testid={line.testId ?? `topology-link-${line.id}`}
            data-margin={line.discovered ? undefined : line.band}
            x1={line.x1}
            y1={line.y1}
            x2={line.x2}
            y2={line.y2}
            stroke={line.discovered ? DISCOVERED_COLOUR : marginColour(line.band)}
            strokeWidth={line.widthPx}
            strokeLinecap="round"
            strokeDasharray={line.discovered ? DISCOVERED_DASH : line.planned ? plannedDash(line.widthPx) : undefined}
            vectorEffect="non-scaling-stroke"
          />
        ))}
        {shown.map((line) => (MARGIN_MARK[line.band] ? <MarginMark key={`mark-${line.id}`} line={line} /> : null))}
      </svg>
    </ViewportPortal>
  );
});
