import pg from 'pg';
import type { Model, ModelStatic, Transaction } from 'sequelize';
import { Link, NetworkSettings, Node, Radio, Site } from '../models';
import { forgetAirViews } from './airViewCache';
import { forgetInventory } from './drift';
import { setHearingChanges } from './ingestCacheMs';
import { forgetTokens } from './ingestTokens';
import { forgetThresholds } from './thresholds';

/** Forgets now and again once the change commits, so a lookup made meanwhile cannot keep the old value. */
function forgetAround(transaction: Transaction | null | undefined, forget: () => void) {
  forget();
  transaction?.afterCommit(forget);
}

interface HookOptions {
  transaction?: Transaction | null;
}
const nodeIdOf = (i: Model) => Number(i.get('nodeId') ?? i.get('id'));
/** A radio moved to another node changes both nodes' inventories. */
const radioNodes = (i: Model) => [nodeIdOf(i), Number(i.previous('nodeId') ?? nodeIdOf(i))];

let installed = false;
/**
 * Edits of thresholds, nodes, sites (who hosts), radios and links forget what ingest cached about
 * them at once in this process (before the change notice arrives), and edits of nodes, radios and links the
 * air view the map and the overview share (airViewCache.ts); the change notices cover every other writer.
 */
export function installIngestCacheHooks() {
  if (installed) return;
  installed = true;
  const on = (model: ModelStatic<Model>, forget: (i: Model) => void) => {
    for (const hook of ['afterCreate', 'afterUpdate', 'afterDestroy', 'afterSave'] as const)
      model.addHook(hook, 'ingest-caches', (i: Model, o: HookOptions) => forgetAround(o.transaction, () => forget(i)));
    for (const hook of ['afterBulkUpdate', 'afterBulkDestroy'] as const)
      model.addHook(hook, 'ingest-caches', (o: HookOptions) => forgetAround(o.transaction, () => forget(null as unknown as Model)));
  };
  on(NetworkSettings, () => forgetThresholds());
  on(Node, (i) => {
    if (i) forgetTokens(nodeIdOf(i));
    else forgetTokens();
    forgetAirViews();
  });
  on(Site, () => forgetTokens());
  on(Radio, (i) => {
    if (i) radioNodes(i).forEach((id) => forgetInventory(id));
    else forgetInventory();
    forgetAirViews();
  });
  // A link joins two radios; which nodes is cheap to forget wholesale, and link edits are rare.
  on(Link, () => {
    forgetInventory();
    forgetAirViews();
  });
}

/** What one change notice (migration 0019) makes this process forget. */
export function applyChangeNotice(notice: string) {
  const [kind, id] = notice.split(':');
  const nodeId = id === undefined ? undefined : Number(id);
  if (kind === 'node') {
    forgetTokens(nodeId);
    forgetAirViews();
  } else if (kind === 'radios') {
    forgetInventory(nodeId);
    forgetAirViews();
  } else if (kind === 'tokens') forgetTokens();
  else if (kind === 'thresholds') forgetThresholds();
}

export interface ChangeNotices {
  /** True while the channel is heard; caches then keep entries until a notice says otherwise. */
  hearing: () => boolean;
  stop: () => Promise<void>;
}

/**
 * Listens for the database's change notices, so ingest's caches forget an edit when it commits, whoever made it.
 * While not listening (not yet connected, or the connection dropped) caches fall back to their short lifetime;
 * on every (re)connect everything is forgotten once, since notices sent meanwhile were missed.
 */
export function hearChangeNotices(databaseUrl: string, retryMs: number): ChangeNotices {
  let current: pg.Client | null = null;
  let heard = false;
  let stopped = false;
  const hear = (on: boolean) => {
    heard = on;
    setHearingChanges(on);
  };
  let retry: NodeJS.Timeout | null = null;
  const lost = (client: pg.Client) => {
    if (current !== client) return;
    current = null;
    hear(false);
    forgetEverything();
    void client.end().catch(() => undefined);
    if (!stopped) retry = setTimeout(connect, retryMs);
  };
  const connect = () => {
    retry = null;
    const client = new pg.Client({ connectionString: databaseUrl, connectionTimeoutMillis: 5_000, application_name: 'parapet ingest notices' });
    current = client;
    client.on('notification', (m) => applyChangeNotice(m.payload ?? ''));
    client.on('error', () => lost(client));
    client.on('end', () => lost(client));
    client
      .connect()
      .then(() => client.query('LISTEN parapet_ingest'))
      .then(() => {
        if (current !== client) return;
        forgetEverything();
        hear(true);
      })
      .catch(() => lost(client));
  };
  connect();
  return {
    hearing: () => heard,
    stop: async () => {
      stopped = true;
      if (retry) clearTimeout(retry);
      const client = current;
      current = null;
      hear(false);
      await client?.end().catch(() => undefined);
    },
  };
}

function forgetEverything() {
  forgetTokens();
  forgetInventory();
  forgetThresholds();
}
