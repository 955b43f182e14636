// Lindenfall's invented past: what happened when, as plain data. Pure; the clock is passed in.
import { DEMO_QUIRKS } from './demoScenario';

export const HISTORY_DAYS = 35;
const MIN_MS = 60_000;
const DAY_MS = 86_400_000;

/** An ordinary outage: the node stops reporting after `lastReportAt` and reports again at `backAt`. */
export interface PlannedOutage {
  node: string;
  lastReportAt: Date;
  backAt: Date;
  /** Who acknowledged it (a person's key in PEOPLE) and when; null = never acknowledged. */
  ack: { by: string; at: Date } | null;
  notes: string | null;
}

/** A backhaul relay that fails and cuts off the nodes behind it. */
export interface PlannedBackhaulFailure extends PlannedOutage {
  behind: string[];
}

export interface PlannedMaintenance {
  node: string;
  announcedBy: string;
  announcedAt: Date;
  startsAt: Date;
  endsAt: Date;
  reason: string;
  /** The node is powered off inside the window, between these two times. */
  silentFrom: Date;
  silentUntil: Date;
}

/** Rain over the town: long 5 GHz links lose a few dB at its peak. */
export interface RainEpisode {
  from: Date;
  to: Date;
  /** Extra loss per km of path at the episode's peak (rain on the path and water on radomes; common practice, no source). */
  peakDbPerKm: number;
}

export interface HistoryPlan {
  start: Date;
  end: Date;
  outages: PlannedOutage[];
  backhaulFailure: PlannedBackhaulFailure;
  flaps: PlannedOutage[];
  maintenance: PlannedMaintenance;
  rain: RainEpisode[];
  /** A backhaul antenna slowly knocked off aim: its signal falls from `from` to the end by `depthDb`. */
  drift: { node: string; from: Date; depthDb: number };
}

/** The plan's days start at UTC midnight so history fills whole daily partitions. */
export const historyStart = (now: Date) => new Date(Math.floor(now.getTime() / DAY_MS) * DAY_MS - HISTORY_DAYS * DAY_MS);

/**
 * The history for a load at `now` (whole minutes): a dozen ordinary outages, one backhaul failure with
 * its neighbourhood stranded behind it, a node that flaps past the mail cap, a host's announced
 * maintenance, three rainy spells and one slowly drifting link. Times are days ago at a UTC hour.
 */
export function planHistory(now: Date): HistoryPlan {
  const end = new Date(Math.floor(now.getTime() / MIN_MS) * MIN_MS);
  const at = (daysAgo: number, hour: number, minute = 0) => {
    const d = new Date(Math.floor(end.getTime() / DAY_MS) * DAY_MS - daysAgo * DAY_MS);
    return new Date(d.getTime() + (hour * 60 + minute) * MIN_MS);
  };
  const plus = (d: Date, minutes: number) => new Date(d.getTime() + minutes * MIN_MS);
  const outage = (
    node: string,
    daysAgo: number,
    hour: number,
    minute: number,
    downMin: number,
    ackAfterMin: number | null,
    by: string,
    notes: string | null,
  ): PlannedOutage => {
    const lastReportAt = at(daysAgo, hour, minute);
    return { node, lastReportAt, backAt: plus(lastReportAt, downMin), ack: ackAfterMin === null ? null : { by, at: plus(lastReportAt, ackAfterMin) }, notes };
  };

  const outages = [
    outage(
      'lf-pier',
      33,
      14,
      10,
      47,
      22,
      'operator',
      'The PoE cable was chewed through in the loft; the host swapped in a spare run while we talked her through it by phone.',
    ),
    outage('lf-glebe', 31, 2, 40, 420, 300, 'operator2', 'Power cut along Glebe Lane overnight; the node came back with the mains.'),
    outage('lf-rope', 29, 19, 5, 38, 19, 'operator', 'The resident unplugged the injector to free the socket. We labelled the plug.'),
    outage('lf-tannery', 27, 8, 20, 95, 20, 'operator', 'Router hung; the host power-cycled it at the socket and it came back.'),
    outage(
      'lf-dyke',
      24,
      11,
      0,
      260,
      35,
      'operator2',
      'Water in the outdoor connector. Resealed with self-amalgamating tape; two people on the ladder, dry day.',
    ),
    outage('lf-orchard', 22, 21, 30, 52, null, 'operator', null),
    outage('lf-customs', 19, 6, 15, 130, 25, 'operator', 'A breaker tripped during the building works downstairs.'),
    outage('lf-vicarage', 16, 15, 45, 70, 21, 'operator2', 'Extension lead knocked out behind the wardrobe.'),
    outage('lf-bakers', 14, 10, 5, 42, null, 'operator', null),
    outage(
      'lf-samphire',
      10,
      17,
      20,
      330,
      40,
      'operator2',
      'The gale turned the CPE off its aim; re-aimed from the roof hatch (harness on) until the signal was back near its prediction.',
    ),
    outage('lf-lookout', 7, 4, 10, 65, 180, 'operator2', 'Nobody home overnight; the host found the injector unplugged in the morning.'),
    outage('lf-granarylane', 3, 13, 30, 28, 18, 'operator', 'Firmware upgrade by the host; back on its own.'),
  ];

  // A minute past a five-minute mark, so every node behind the relay had just reported when it died:
  // the live rule joins silences whose last reports lie within two minutes of each other.
  const failureStart = at(12, 19, 41);
  const backhaulFailure: PlannedBackhaulFailure = {
    node: 'lf-marsh',
    lastReportAt: failureStart,
    backAt: plus(failureStart, 222),
    ack: { by: 'operator2', at: plus(failureStart, 24) },
    notes:
      'The surge arrester at the water tower failed after the storm and took the relay down with it. ' +
      'Replaced it; everything on Saltmarsh Row behind the tower was cut off for the evening.',
    behind: ['lf-reed', 'lf-heron', 'lf-tide', 'lf-samphire', 'lf-dyke', 'lf-brine'],
  };

  // Four minutes down, five up, six times in one hour: more changes than the mail cap allows.
  const flapStart = at(5, 16, 0);
  const flaps = Array.from({ length: 6 }, (_, i): PlannedOutage => {
    const lastReportAt = plus(flapStart, i * 9);
    return { node: 'lf-weir', lastReportAt, backAt: plus(lastReportAt, 4), ack: null, notes: null };
  });
  flaps[5] = {
    ...flaps[5],
    ack: { by: 'operator', at: plus(flaps[5].backAt, 20) },
    notes: 'Loose Ethernet plug in the injector; reseated. The mail cap kicked in after four changes.',
  };

  const windowStart = at(8, 9, 0);
  const maintenance: PlannedMaintenance = {
    node: 'lf-belfry',
    announcedBy: 'h8',
    announcedAt: at(9, 18, 15),
    startsAt: windowStart,
    endsAt: plus(windowStart, 150),
    reason: 'Roofers are replacing the flashing around the chimney; power to the loft is off.',
    silentFrom: plus(windowStart, 5),
    silentUntil: plus(windowStart, 130),
  };

  const rain: RainEpisode[] = [
    { from: at(20, 3, 0), to: at(20, 9, 0), peakDbPerKm: 2.2 },
    { from: at(9, 14, 0), to: at(9, 18, 0), peakDbPerKm: 1.6 },
    { from: at(2, 5, 0), to: at(2, 7, 30), peakDbPerKm: 1.2 },
  ];

  return {
    start: historyStart(end),
    end,
    outages,
    backhaulFailure,
    flaps,
    maintenance,
    rain,
    drift: { node: DEMO_QUIRKS.driftingNode, from: at(12, 0, 0), depthDb: -DEMO_QUIRKS.driftDb },
  };
}

/** Every span in which a node sent nothing: (lastReportAt, backAt], per node name. */
export function silences(plan: HistoryPlan): Map<string, { after: Date; until: Date }[]> {
  const out = new Map<string, { after: Date; until: Date }[]>();
  const add = (node: string, after: Date, until: Date) => out.set(node, [...(out.get(node) ?? []), { after, until }]);
  for (const o of [...plan.outages, ...plan.flaps]) add(o.node, o.lastReportAt, o.backAt);
  const f = plan.backhaulFailure;
  add(f.node, f.lastReportAt, f.backAt);
  // Nodes behind the relay fall silent with it and report again a minute or two after it returns.
  f.behind.forEach((node, i) => add(node, f.lastReportAt, new Date(f.backAt.getTime() + (1 + (i % 2)) * MIN_MS)));
  add(plan.maintenance.node, plan.maintenance.silentFrom, plan.maintenance.silentUntil);
  return out;
}
