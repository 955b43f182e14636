// Values that keep their identity while what the map draws from them stays the same, so memos keyed on them survive live events.
import { useRef } from 'react';
import type { TopologyNode } from '../api/topology';

/** Same names and places, node by node: live events change states only, so most arrays pass on identity alone. */
export function samePlaces(a: TopologyNode[], b: TopologyNode[]): boolean {
  if (a.length !== b.length) return false;
  for (let i = 0; i < a.length; i++) {
    const x = a[i];
    const y = b[i];
    if (x === y) continue;
    if (x.id !== y.id || x.latitude !== y.latitude || x.longitude !== y.longitude || x.name !== y.name || x.siteName !== y.siteName) return false;
  }
  return true;
}

export const sameOptions = (a: { value: string; label: string }[], b: { value: string; label: string }[]) =>
  a.length === b.length && a.every((o, i) => o.value === b[i].value && o.label === b[i].label);

/** The value first seen, for as long as each new one is the same by `same`: memos keyed on it then survive live events. */
export function useSameWhile<T>(value: T, same: (kept: T, next: T) => boolean): T {
  const kept = useRef(value);
  // eslint-disable-next-line react-hooks/refs -- a render-time memo store: it only ever returns a value equal to the one given
  if (kept.current !== value && !same(kept.current, value)) kept.current = value;
  // eslint-disable-next-line react-hooks/refs -- as above
  return kept.current;
}

/** The node list as it was when names and places last changed: a state change keeps it. */
export const useSamePlaces = (nodes: TopologyNode[]) => useSameWhile(nodes, samePlaces);
