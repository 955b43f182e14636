import { compose, type FooterLinks, formatLocal, type Rendered } from './compose';

/** To an opted-in host whose node is cut off by a failure further up: short, and nothing to do. */
export function hostUpstream(
  f: { recipientName: string; nodeName: string; siteName: string; since: Date; timeZone: string; recoveryUrl?: string | null },
  footer: FooterLinks,
): Rendered {
  return compose(
    `The network upstream of your node (${f.nodeName}) is down; nothing is needed from you`,
    [
      { kind: 'p', text: `Hello ${f.recipientName},` },
      {
        kind: 'p',
        text: `Since ${formatLocal(f.since, f.timeZone)} a part of the community network further up than "${f.nodeName}" at ${f.siteName} is down, so your node cannot reach the internet. Your own box is not the problem as far as we can tell.`,
      },
      {
        kind: 'p',
        text: 'Nothing is needed from you: please leave it plugged in. The volunteers already know and are on it; it will come back by itself once the upstream part is fixed.',
      },
      ...(f.recoveryUrl ? [{ kind: 'link' as const, label: 'See on your phone when it is back (no password needed)', url: f.recoveryUrl }] : []),
    ],
    footer,
  );
}

export interface PartitionFacts {
  recipientName: string;
  uplinkNames: string[];
  nodeCount: number;
  since: Date;
  timeZone: string;
  consoleUrl: string;
}

/** To admins once when the cut contains Parapet's own side: its uplink went silent with what hangs off it. */
export function partitionNotice(f: PartitionFacts, footer: FooterLinks): Rendered {
  const uplinks = f.uplinkNames.join(', ');
  return compose(
    `Parapet lost sight of the network behind ${uplinks} (${f.nodeCount} node${f.nodeCount === 1 ? '' : 's'})`,
    [
      { kind: 'p', text: `Hello ${f.recipientName},` },
      {
        kind: 'p',
        text: `At ${formatLocal(f.since, f.timeZone)} the uplink ${uplinks} and ${f.nodeCount - f.uplinkNames.length} node(s) behind it stopped reporting together. Parapet reaches the network through that uplink, so from here it cannot tell whether the uplink node, its internet connection, or Parapet's own connection failed.`,
      },
      {
        kind: 'p',
        text: "The nodes are shown as stranded and no outage mail went to operators or hosts. Check the uplink and Parapet's own connection first; the nodes come back on their own when reports arrive again.",
      },
      { kind: 'link', label: 'Open Parapet', url: f.consoleUrl },
    ],
    footer,
  );
}
