import type http from 'node:http';
import type { Request } from 'express';
import type { Server, Socket } from 'socket.io';
import type { Config } from '../config';
import { loadActor, type Actor } from '../policies/actor';
import { roomsOf } from '../policies/node';

/** Every socket of a person also sits in this room, so their rooms can be found and changed from any instance. */
export const personRoom = (userId: number) => `user:${userId}`;

/**
 * The handshake's Origin must be this site (the Host it was sent to, or PUBLIC_URL): a page elsewhere
 * cannot open a live feed with a signed-in person's cookie. No Origin means no browser page is asking.
 */
export function sameOrigin(req: http.IncomingMessage, config: Config): boolean {
  const origin = req.headers.origin;
  if (!origin) return true;
  let url: URL;
  try {
    url = new URL(origin);
  } catch {
    return false;
  }
  if (req.headers.host && url.host === req.headers.host) return true;
  try {
    return url.origin === new URL(config.publicUrl).origin;
  } catch {
    return false;
  }
}

/** Joins a new socket to its rooms and ends it when its session reaches its absolute lifetime. */
export function admit(socket: Socket, config: Config) {
  const actor = (socket.request as Request).user as Actor;
  socket.data.userId = actor.id;
  void socket.join([personRoom(actor.id), ...roomsOf(actor)]);
  const signedInAt = (socket.request as Request).session?.signedInAt;
  if (signedInAt !== undefined) {
    const leftMs = Math.min(signedInAt + config.sessionAbsoluteMs - config.now().getTime(), 2 ** 31 - 1);
    const timer = setTimeout(() => socket.disconnect(true), Math.max(0, leftMs));
    socket.once('disconnect', () => clearTimeout(timer));
  }
}

/**
 * Re-reads each person's access and moves their sockets on every instance (through the adapter) into
 * exactly the rooms they may now hear; a person who is gone or deactivated is disconnected at once.
 * Each socket then hears `access:changed`, so the page can refetch what it shows.
 */
export async function refreshRooms(io: Server, userIds: number[]) {
  for (const userId of new Set(userIds)) {
    const room = personRoom(userId);
    const actor = await loadActor(userId);
    if (!actor) {
      io.in(room).disconnectSockets(true);
      continue;
    }
    const wanted = new Set([room, ...roomsOf(actor)]);
    for (const socket of await io.in(room).fetchSockets()) {
      const stale = [...socket.rooms].filter((r) => r !== socket.id && !wanted.has(r));
      for (const r of stale) socket.leave(r);
      socket.join([...wanted]);
    }
    io.in(room).emit('access:changed', { userId, role: actor.role, neighbourhoodIds: actor.neighbourhoodIds });
  }
}
