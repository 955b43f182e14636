import { type Block, compose, type FooterLinks, formatDuration, formatLocal, type Rendered } from './compose';

export interface HostFacts {
  recipientName: string;
  nodeName: string;
  siteName: string;
  neighbourhoodName: string;
  since: Date;
  timeZone: string;
  operators: { name: string; email: string }[];
  /** The step-by-step page for the host's phone (outage mail only). */
  recoveryUrl?: string | null;
}

const contactBlock = (f: HostFacts): Block =>
  f.operators.length
    ? { kind: 'ul', items: f.operators.map((o) => `${o.name} <${o.email}>`) }
    : { kind: 'p', text: `No operator is assigned to ${f.neighbourhoodName} yet; reply to the network's coordinators.` };

/** Plain language for a resident: what stopped, what to look at in order, what not to do, whom to ask. */
export function hostOffline(f: HostFacts, footer: FooterLinks): Rendered {
  return compose(
    `The network box on your roof (${f.nodeName}) has stopped answering`,
    [
      { kind: 'p', text: `Hello ${f.recipientName},` },
      {
        kind: 'p',
        text: `The community network's box "${f.nodeName}" at ${f.siteName} stopped answering at ${formatLocal(f.since, f.timeZone)}. The volunteers who look after ${f.neighbourhoodName} have been told too.`,
      },
      ...(f.recoveryUrl
        ? [
            {
              kind: 'link',
              label: 'Open the step-by-step help on your phone (no password needed; tells the volunteers what you tried)',
              url: f.recoveryUrl,
            } as Block,
          ]
        : []),
      { kind: 'p', text: 'If you can do so safely, please check these, in this order:' },
      {
        kind: 'ol',
        items: [
          'Power: is its plug in and the socket or power strip switched on? Did anything else in the house lose power?',
          'The power-over-Ethernet injector (the small adapter between the mains plug and the network cable): is its light on, and is the cable pushed fully into it?',
          'The cable at the radio: where you can see it, is the cable still plugged into the box and undamaged (not pinched, chewed or loose)?',
          'The antenna: from the ground or a window, does it look as if it has moved, tilted or been knocked since you last saw it? Please do not re-aim it yourself; tell the operators.',
        ],
      },
      {
        kind: 'caution',
        text: 'Do not climb onto the roof or up a ladder, and do not open sockets, power supplies or the injector. Follow your local rules: roof and mast work and anything on mains power are for people trained or licensed to do it. What you can see from indoors or from the ground is plenty.',
      },
      { kind: 'p', text: `Who to contact (the operators for ${f.neighbourhoodName}):` },
      contactBlock(f),
      { kind: 'p', text: 'You will get another short message when it is back. Thank you for hosting it.' },
    ],
    footer,
  );
}

/** `until`: the outage mail never got through (mail trouble), so this one tells the whole span instead. */
export function hostOnline(f: HostFacts & { downForS: number; until?: Date }, footer: FooterLinks): Rendered {
  return compose(
    `The network box on your roof (${f.nodeName}) is back`,
    [
      { kind: 'p', text: `Hello ${f.recipientName},` },
      f.until
        ? {
            kind: 'p',
            text: `"${f.nodeName}" at ${f.siteName} was down from ${formatLocal(f.since, f.timeZone)} to ${formatLocal(f.until, f.timeZone)} (${formatDuration(f.downForS)}). It is answering again. Our message about the outage could not be delivered while it lasted.`,
          }
        : {
            kind: 'p',
            text: `"${f.nodeName}" at ${f.siteName} is answering again. It was out for ${formatDuration(f.downForS)}, from ${formatLocal(f.since, f.timeZone)}.`,
          },
      { kind: 'p', text: 'There is nothing more you need to do. If you changed something to bring it back, the operators would be glad to hear what:' },
      contactBlock(f),
    ],
    footer,
  );
}
