import type { z } from 'zod';
import type { Band } from '../../shared/enums';
import { channelProblem } from '../../shared/radio/channels';
import type { RadioCreate, radioListQuerySchema, radioUpdateSchema } from '../../shared/schemas/radio';
import { Invalid } from '../errors';
import { Radio } from '../models';
import type { Actor } from '../policies/actor';
import { radioNodeInScope } from '../policies/radio';
import { uniquely } from './conflicts';
import { filters, listPage } from './listing';
import { readableRadio } from './references';

/** Band, channel and width must agree after a partial update too (one rule: shared/radio/channels.ts). */
function checkBandChannel(band: Band, channel: number, channelWidthMHz: number) {
  const problem = channelProblem(band, channel, channelWidthMHz);
  if (!problem) return;
  const sentence = problem.field === 'channel' ? 'The channel does not fit the band.' : 'The channel width does not fit the band.';
  const message = `${problem.field} ${problem.message}`;
  const summary = problem.message.startsWith('must be 1–14') ? sentence : `${sentence} ${message[0].toUpperCase()}${message.slice(1)}.`;
  throw Invalid(summary, [{ path: problem.field, message }]);
}

const duplicateIface = (iface: string) => `That node already has a radio on interface ${iface}. Choose another interface name.`;

/** One page of the radios on nodes the caller may read. */
export function listRadios(actor: Actor, q: z.infer<typeof radioListQuerySchema>) {
  return listPage(Radio, q, {
    where: filters({ nodeId: q.nodeId, band: q.band, role: q.role }),
    sortable: ['iface', 'nodeId', 'band', 'channel', 'role', 'encryption', 'txPowerDbm', 'createdAt', 'id'],
    searchable: ['ssid', 'iface'],
    defaultSort: 'id',
    include: [radioNodeInScope(actor)],
  });
}

export const createRadio = (body: RadioCreate) => uniquely(() => Radio.create(body), duplicateIface(body.iface));

/** Applies a partial update, checking band, channel and width together; answers the radio as stored, with its node. */
export async function updateRadio(actor: Actor, r: Radio, body: z.infer<typeof radioUpdateSchema>) {
  checkBandChannel(body.band ?? r.band, body.channel ?? r.channel, body.channelWidthMHz ?? r.channelWidthMHz);
  await uniquely(() => r.update(body), duplicateIface(body.iface ?? r.iface));
  return readableRadio(actor, r.id);
}

export const removeRadio = (r: Radio) => r.destroy();
