import { hostSummary } from '../../shared/health/hostWords';
import type { HostedSiteDto } from '../../shared/schemas/account';
import { localClock } from '../../shared/time/monthRange';
import type { Actor } from '../policies/actor';
import { mayAnnounceMaintenance } from '../policies/maintenance';
import type { hostedSitesOf } from '../services/hostedSites';
import { presentMaintenanceWindows } from './alerts';
import { iso } from './common';

/** A host's view in plain words: each node's state as a sentence in the network's time zone, no contact details of others. */
export function presentHostedSites(actor: Actor, h: Awaited<ReturnType<typeof hostedSitesOf>>, now: Date): HostedSiteDto[] {
  const clock = (d: Date | null) => (d ? localClock(new Date(d), h.timeZone, now) : null);
  const maintenance = (n: (typeof h.nodes)[number]) => presentMaintenanceWindows(h.windowsByNode.get(n.id) ?? [], now, mayAnnounceMaintenance(actor, n));
  return h.sites.map((s) => ({
    id: s.id,
    name: s.name,
    neighbourhoodName: h.neighbourhoods.find((n) => n.id === s.neighbourhoodId)?.name ?? '',
    nodes: h.nodes
      .filter((n) => n.siteId === s.id)
      .map((n) => ({
        id: n.id,
        name: n.name,
        state: n.state,
        stateSince: iso(n.stateSince),
        lastSeenAt: iso(n.lastSeenAt),
        summary: hostSummary({ siteName: s.name, state: n.state, lastSeenClock: clock(n.lastSeenAt), sinceClock: clock(n.stateSince) }),
        availability: h.availability.byNode(n.id),
        recentOutages: h.outages
          .filter((o) => o.nodeId === n.id)
          .map((o) => ({ id: o.id, startedAt: iso(o.startedAt)!, endedAt: iso(o.endedAt), acknowledged: Boolean(o.acknowledgedAt) })),
        maintenance: maintenance(n),
      })),
  }));
}
