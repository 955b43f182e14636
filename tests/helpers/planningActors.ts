import { NetworkSettings } from '../../server/models';
import { buildUser, signIn, type TestContext } from './api';
import { buildNeighbourhood, buildNode } from './factories';

/** The people every planning route is tried with: an admin, an operator with a node, an outside operator, a host. */
export async function planningCast(ctx: TestContext) {
  const operator = await buildUser({ role: 'operator' });
  const hood = await buildNeighbourhood({ operators: [operator] });
  const node = await buildNode({ neighbourhoodId: hood.id });
  const otherHood = await buildNeighbourhood();
  const otherNode = await buildNode({ neighbourhoodId: otherHood.id });
  const [admin, op, outsider, host] = await Promise.all([
    buildUser({ role: 'admin' }).then((u) => signIn(ctx, u)),
    signIn(ctx, operator),
    buildUser({ role: 'operator' }).then(async (u) => {
      await buildNeighbourhood({ operators: [u] });
      return signIn(ctx, u);
    }),
    buildUser({ role: 'host' }).then((u) => signIn(ctx, u)),
  ]);
  return { admin, op, outsider, host, hood, node, otherHood, otherNode };
}

export async function setNetwork(values: Partial<{ region: 'US' | 'EU' | 'JP'; addressPool: string | null }>) {
  await NetworkSettings.update(values, { where: { id: 1 } });
}
