import { type Block, compose, type FooterLinks, formatDuration, formatLocal, type Rendered } from './compose';

export interface LastFigures {
  receivedAt?: string | null;
  signalDbm?: number | null;
  snrDb?: number | null;
  throughputMbps?: number | null;
  latencyMs?: number | null;
  uptimeS?: number | null;
  firmware?: string | null;
}

export interface OperatorFacts {
  recipientName: string;
  nodeId: number;
  nodeName: string;
  siteName: string;
  neighbourhoodName: string;
  hostName: string | null;
  since: Date;
  timeZone: string;
  nodeUrl: string;
  lastSeenAt: Date | null;
  lastReport: LastFigures | null;
  neighbours: { name: string; state: string }[];
  ackUrl: string | null;
  /** What is cut off behind this node (stranded), when anything is. */
  behind?: BehindFacts | null;
}

export interface BehindFacts {
  nodeCount: number;
  clients: number;
  neighbourhoodNames: string[];
  nodes: { name: string; neighbourhoodName: string }[];
}

const figure = (v: number | null | undefined, unit: string) => (v == null ? 'not reported' : `${v} ${unit}`);

const cutOff = (b: BehindFacts) => `${b.nodeCount} node${b.nodeCount === 1 ? '' : 's'} cut off`;

/** The blast radius: every node that went silent only because this one did, so nobody chases them separately. */
function behindBlocks(f: OperatorFacts): Block[] {
  const b = f.behind;
  if (!b?.nodeCount) return [];
  return [
    { kind: 'h', text: `Cut off behind it: ${cutOff(b)}, ${b.clients} client${b.clients === 1 ? '' : 's'} at their last report` },
    {
      kind: 'p',
      text: `These nodes lost their only path to the uplink through ${f.nodeName} and are shown as stranded (${b.neighbourhoodNames.join(', ')}). They get no outage of their own and their hosts are not asked to check anything; fix ${f.nodeName} or its link first.`,
    },
    { kind: 'ul', items: b.nodes.map((n) => `${n.name} (${n.neighbourhoodName})`) },
  ];
}

function nodeBlocks(f: OperatorFacts): Block[] {
  const r = f.lastReport ?? {};
  return [
    ...behindBlocks(f),
    {
      kind: 'facts',
      rows: [
        ['Node', `${f.nodeName} (#${f.nodeId})`],
        ['Site', f.siteName],
        ['Neighbourhood', f.neighbourhoodName],
        ['Host', f.hostName ?? 'none recorded'],
        ['Last report', f.lastSeenAt ? formatLocal(f.lastSeenAt, f.timeZone) : 'never'],
      ],
    },
    { kind: 'h', text: 'Last figures' },
    {
      kind: 'facts',
      rows: [
        ['Weakest signal', figure(r.signalDbm, 'dBm')],
        ['Weakest SNR', figure(r.snrDb, 'dB')],
        ['Throughput', figure(r.throughputMbps, 'Mbps')],
        ['Latency', figure(r.latencyMs, 'ms')],
        ['Uptime', r.uptimeS == null ? 'not reported' : formatDuration(r.uptimeS)],
        ['Firmware', r.firmware ?? 'not reported'],
      ],
    },
    { kind: 'h', text: 'Neighbours on the graph' },
    f.neighbours.length ? { kind: 'ul', items: f.neighbours.map((n) => `${n.name}: ${n.state}`) } : { kind: 'p', text: 'No links recorded for this node.' },
    { kind: 'link', label: 'Open the node in Parapet', url: f.nodeUrl },
  ];
}

const ackBlocks = (f: OperatorFacts): Block[] => (f.ackUrl ? [{ kind: 'link', label: 'Acknowledge this outage (stops the reminders)', url: f.ackUrl }] : []);

export function operatorOffline(f: OperatorFacts, footer: FooterLinks): Rendered {
  const behind = f.behind?.nodeCount ? `, ${cutOff(f.behind)} behind it` : '';
  return compose(
    `Offline: ${f.nodeName} (${f.neighbourhoodName}) since ${formatLocal(f.since, f.timeZone)}${behind}`,
    [
      {
        kind: 'p',
        text: `${f.nodeName} stopped reporting and is offline since ${formatLocal(f.since, f.timeZone)}. Its host has been sent a plain-language checklist.`,
      },
      ...nodeBlocks(f),
      ...ackBlocks(f),
    ],
    footer,
  );
}

export function operatorReminder(f: OperatorFacts & { downForS: number }, footer: FooterLinks): Rendered {
  return compose(
    `Still offline: ${f.nodeName} (${f.neighbourhoodName}), ${formatDuration(f.downForS)}`,
    [
      { kind: 'p', text: `${f.nodeName} has been offline for ${formatDuration(f.downForS)} and nobody has acknowledged it yet.` },
      ...nodeBlocks(f),
      ...ackBlocks(f),
    ],
    footer,
  );
}

/** `until`: the outage mail never got through (mail trouble), so this one tells the whole span instead. */
export function operatorOnline(f: OperatorFacts & { downForS: number; until?: Date }, footer: FooterLinks): Rendered {
  return compose(
    `Back online: ${f.nodeName} (${f.neighbourhoodName}) after ${formatDuration(f.downForS)}`,
    [
      f.until
        ? {
            kind: 'p',
            text: `${f.nodeName} was down from ${formatLocal(f.since, f.timeZone)} to ${formatLocal(f.until, f.timeZone)} (${formatDuration(f.downForS)}) and is reporting again. The mail about the outage could not be delivered while it lasted.`,
          }
        : { kind: 'p', text: `${f.nodeName} is reporting again. The outage lasted ${formatDuration(f.downForS)}, from ${formatLocal(f.since, f.timeZone)}.` },
      { kind: 'link', label: 'Open the node in Parapet', url: f.nodeUrl },
    ],
    footer,
  );
}

/** Sent once when a node changed state more often in an hour than the cap allows; later changes that hour are not mailed. */
export function flapSummary(
  f: { nodeName: string; neighbourhoodName: string; nodeUrl: string; changes: number; stateNow: string },
  footer: FooterLinks,
): Rendered {
  return compose(
    `Unsteady: ${f.nodeName} (${f.neighbourhoodName}) keeps dropping and coming back`,
    [
      { kind: 'p', text: `${f.nodeName} has changed between offline and online ${f.changes} times within the last hour. It is ${f.stateNow} right now.` },
      { kind: 'p', text: 'To spare your inbox, Parapet holds back further mail about it until the hour has passed. Watch it live in the console.' },
      { kind: 'link', label: 'Open the node in Parapet', url: f.nodeUrl },
    ],
    footer,
  );
}
