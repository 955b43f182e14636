import type { Model, ModelStatic, Transaction } from 'sequelize';
import { Link, NetworkSettings, Node, Radio, Site } from '../models';
import { forgetAirViews } from './airViewCache';
import { forgetInventory } from './drift';
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
 * them, and edits of nodes, radios and links the air view the map and the overview share
 * (airViewCache.ts). Hooks see model saves; bulk statements and other instances are covered by the
 * cache lifetime.
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
