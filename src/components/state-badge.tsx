import { useId } from 'react';
import type { NodeState } from '../../shared/enums';

// Colour, shape and word together, so a state never depends on colour vision alone.
const LOOK: Record<NodeState, { word: string; shape: string }> = {
  online: { word: 'Online', shape: 'filled circle' },
  degraded: { word: 'Degraded', shape: 'triangle' },
  offline: { word: 'Offline', shape: 'square' },
  maintenance: { word: 'Maintenance', shape: 'hatched circle' },
  stranded: { word: 'Stranded', shape: 'hollow diamond' },
  unknown: { word: 'Unknown', shape: 'hollow circle' },
};

export function stateWord(state: NodeState): string {
  return LOOK[state].word;
}

export function StateShape({ state, size = 14 }: { state: NodeState; size?: number }) {
  const hatchId = useId();
  const label = `${LOOK[state].word} (${LOOK[state].shape})`;
  return (
    <svg width={size} height={size} viewBox="0 0 16 16" role="img" aria-label={label} className="shrink-0">
      {state === 'online' && <circle cx="8" cy="8" r="6.5" className="fill-state-online" />}
      {state === 'degraded' && (
        <path d="M8 1.5 15 14.5H1z" className="fill-state-degraded stroke-state-degraded-edge" strokeWidth="0.8" strokeLinejoin="round" />
      )}
      {state === 'offline' && <rect x="2" y="2" width="12" height="12" rx="1" className="fill-state-offline" />}
      {state === 'maintenance' && (
        <>
          <defs>
            <pattern id={hatchId} width="3" height="3" patternUnits="userSpaceOnUse" patternTransform="rotate(45)">
              <rect width="3" height="3" className="fill-state-maintenance" />
              <line x1="0" y1="0" x2="0" y2="3" className="stroke-state-maintenance-hatch" strokeWidth="1.2" />
            </pattern>
          </defs>
          <circle cx="8" cy="8" r="6.3" fill={`url(#${hatchId})`} className="stroke-state-maintenance-edge" strokeWidth="1.4" />
        </>
      )}
      {state === 'stranded' && <path d="M8 1.6 14.4 8 8 14.4 1.6 8z" fill="none" className="stroke-state-stranded" strokeWidth="2.2" strokeLinejoin="round" />}
      {state === 'unknown' && <circle cx="8" cy="8" r="5.8" fill="none" className="stroke-state-unknown" strokeWidth="2" />}
    </svg>
  );
}

export function StateBadge({ state, count }: { state: NodeState; count?: number }) {
  return (
    <span
      data-testid={`state-badge-${state}`}
      className="inline-flex items-center gap-1.5 rounded-full border border-line bg-surface px-2.5 py-0.5 text-sm font-medium whitespace-nowrap text-ink"
    >
      <StateShape state={state} />
      <span>{LOOK[state].word}</span>
      {count !== undefined && <span className="ml-0.5 tabular-nums font-semibold">{count}</span>}
    </span>
  );
}
