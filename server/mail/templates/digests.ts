import { compose, type FooterLinks, formatDuration, formatLocal, type Rendered } from './compose';

/** To admins once when the health check finds it had stopped running: what Parapet could not watch. */
export function selfCheck(
  f: { recipientName: string; gapS: number | null; resumedAt: Date; timeZone: string; consoleUrl: string },
  footer: FooterLinks,
): Rendered {
  const gap = f.gapS == null ? 'for an unknown time (first run on this database)' : `for about ${formatDuration(f.gapS)}`;
  return compose(
    `Parapet's health check was not running ${f.gapS == null ? '' : `for ${formatDuration(f.gapS)}`}`.trim(),
    [
      { kind: 'p', text: `Hello ${f.recipientName},` },
      {
        kind: 'p',
        text: `Parapet's own health check did not run ${gap}, up to ${formatLocal(f.resumedAt, f.timeZone)}. While it was stopped, no node could be marked offline and no outage mail went out.`,
      },
      {
        kind: 'p',
        text: 'It is watching again. To avoid a flood of false alarms it gives every node one full report window before judging it, so look over the console for anything that went wrong in the gap.',
      },
      { kind: 'link', label: 'Open Parapet', url: f.consoleUrl },
    ],
    footer,
  );
}

export interface DigestLine {
  nodeName: string;
  neighbourhoodName: string;
  sinceAt: Date;
  reason: string | null;
}

/** Once a day: nodes that stayed degraded for hours, for the operators of their neighbourhoods. */
export function degradedDigest(
  f: { recipientName: string; lines: DigestLine[]; now: Date; timeZone: string; consoleUrl: string },
  footer: FooterLinks,
): Rendered {
  return compose(
    `Daily digest: ${f.lines.length} node${f.lines.length === 1 ? '' : 's'} degraded for hours`,
    [
      {
        kind: 'p',
        text: `Hello ${f.recipientName}, these nodes are reporting but have been below their signal, SNR or throughput thresholds for hours. Not urgent; worth a look when you plan the next visit.`,
      },
      {
        kind: 'ul',
        items: f.lines.map(
          (l) =>
            `${l.nodeName} (${l.neighbourhoodName}): degraded for ${formatDuration((f.now.getTime() - l.sinceAt.getTime()) / 1000)}${l.reason ? `, ${l.reason}` : ''}`,
        ),
      },
      { kind: 'link', label: 'Open Parapet', url: f.consoleUrl },
    ],
    footer,
  );
}

export interface ChangeLine {
  nodeName: string;
  neighbourhoodName: string;
  toState: string;
  at: Date;
}

/** For operators who chose an hourly digest: the past hour's offline and back-online changes in one message. */
export function hourlyDigest(f: { recipientName: string; lines: ChangeLine[]; timeZone: string; consoleUrl: string }, footer: FooterLinks): Rendered {
  return compose(
    `Hourly digest: ${f.lines.length} node change${f.lines.length === 1 ? '' : 's'}`,
    [
      { kind: 'p', text: `Hello ${f.recipientName}, in the past hour:` },
      { kind: 'ul', items: f.lines.map((l) => `${formatLocal(l.at, f.timeZone)}: ${l.nodeName} (${l.neighbourhoodName}) went ${l.toState}`) },
      { kind: 'link', label: 'Open Parapet', url: f.consoleUrl },
    ],
    footer,
  );
}
