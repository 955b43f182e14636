import { Button } from '../../../components/button';
import { formatDateTime, formatSince } from '../../../lib/format';
import { useAddDiscoveredLink, type Topology } from '../api/topology';

const name = (names: Map<number, string>, id: number) => names.get(id) ?? `node ${id}`;

/**
 * What the radios' own reports say that the inventory does not: pairs talking with no link listed
 * (one click adds it), listed links nobody has heard for a day, and radios that moved between nodes.
 */
export function AirFindings({
  topology,
  names,
  nodeId,
}: {
  topology: Topology;
  names: Map<number, string>;
  /** Only what touches this node. */ nodeId?: number;
}) {
  const add = useAddDiscoveredLink();
  const touches = (a: number, b: number) => nodeId === undefined || a === nodeId || b === nodeId;
  const discovered = (topology.discoveredLinks ?? []).filter((d) => touches(d.nodeAId, d.nodeBId));
  const silent = topology.links.filter((l) => l.plannedButSilent && touches(l.nodeAId, l.nodeBId));
  const moves = (topology.radioMoves ?? []).filter((m) => touches(m.fromNodeId, m.toNodeId));
  if (!discovered.length && !silent.length && !moves.length) return null;
  return (
    <section aria-labelledby="air-title" data-testid="air-findings" className="mt-4 rounded-lg border border-line bg-surface p-3 text-sm">
      <h2 id="air-title" className="text-base font-semibold">
        Heard on the air
      </h2>
      <p className="text-muted">From the MACs the radios report: what the inventory misses or says differently.</p>
      {discovered.length > 0 && (
        <>
          <h3 className="mt-3 font-medium">Talking, but not in the inventory</h3>
          <ul className="mt-1 divide-y divide-line">
            {discovered.map((d) => (
              <li
                key={`${d.radioAId}-${d.radioBId}`}
                data-testid={`discovered-${d.radioAId}-${d.radioBId}`}
                className="flex flex-wrap items-center justify-between gap-2 py-1.5"
              >
                <span>
                  {name(names, d.nodeAId)} ↔ {name(names, d.nodeBId)}
                  <span className="text-muted">
                    {' '}
                    · {d.signalDbm === null ? 'signal not reported' : `${d.signalDbm} dBm`} · heard {formatSince(d.lastSeenAt)}
                  </span>
                </span>
                {d.abilities?.add && (
                  <Button onClick={() => add.mutate(d)} disabled={add.isPending}>
                    Add to the inventory
                    <span className="sr-only">
                      {' '}
                      as a live link between {name(names, d.nodeAId)} and {name(names, d.nodeBId)}
                    </span>
                  </Button>
                )}
              </li>
            ))}
          </ul>
          {add.isError && (
            <p role="alert" className="text-danger">
              {add.error.message}
            </p>
          )}
        </>
      )}
      {silent.length > 0 && (
        <>
          <h3 className="mt-3 font-medium">Planned but silent (nobody has named the other end for a day)</h3>
          <ul className="mt-1 list-disc pl-5">
            {silent.map((l) => (
              <li key={l.id} data-testid={`silent-link-${l.id}`}>
                {l.name ?? `${name(names, l.nodeAId)} ↔ ${name(names, l.nodeBId)}`}
              </li>
            ))}
          </ul>
        </>
      )}
      {moves.length > 0 && (
        <>
          <h3 className="mt-3 font-medium">Radios that moved</h3>
          <ul className="mt-1 list-disc pl-5">
            {moves.map((m) => (
              <li key={m.id} data-testid={`radio-move-${m.id}`}>
                <code>{m.mac}</code> was on {m.fromNodeName} ({m.fromIface}), now reports from {m.toNodeName} ({m.toIface}) since {formatDateTime(m.at)}
              </li>
            ))}
          </ul>
        </>
      )}
    </section>
  );
}
