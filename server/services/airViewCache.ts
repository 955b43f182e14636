import type { Sequelize } from 'sequelize';
import { airView, type AirWindows } from './airObservations';

export type AirView = Awaited<ReturnType<typeof airView>>;

// Keyed by windows and the nodes read; the oldest entries go past this many (one per distinct scope in use).
const MAX_ENTRIES = 200;
const views = new Map<string, { now: number; view: Promise<AirView> }>();

/**
 * The air view as `airView` computes it, shared for `lifetimeMs` of the clock by everyone who reads the same nodes
 * (the map and the overview of one role and neighbourhoods), and by requests that arrive while it is being worked
 * out. Inventory edits through this process forget it at once (model hooks in ingestCaches.ts, learned MACs in
 * radioMacs.ts); new reports and other instances' edits show when the entry expires. 0 turns the cache off.
 */
export function recentAirView(sequelize: Sequelize, now: Date, windows: AirWindows, nodeIds: number[] | null, lifetimeMs: number): Promise<AirView> {
  if (lifetimeMs <= 0) return airView(sequelize, now, windows, nodeIds);
  const key = `${windows.observedWindowS}:${windows.silentAfterS}:${nodeIds === null ? 'all' : [...nodeIds].sort((a, b) => a - b).join(',')}`;
  const at = now.getTime();
  const hit = views.get(key);
  if (hit && at >= hit.now && at - hit.now < lifetimeMs) return hit.view;
  const view = airView(sequelize, now, windows, nodeIds);
  views.delete(key);
  views.set(key, { now: at, view });
  if (views.size > MAX_ENTRIES) views.delete(views.keys().next().value!);
  // A failed read is not kept: the next request tries again.
  view.catch(() => views.get(key)?.view === view && views.delete(key));
  return view;
}

/** An inventory edit (links, radios, their MACs, nodes): the next request works the air view out afresh. */
export const forgetAirViews = () => views.clear();
