import { useState } from 'react';
import type { NodeDto } from '../../../../shared/schemas/node';
import { NODE_STATES } from '../../../../shared/enums';
import { Button } from '../../../components/button';
import { FilterSelect } from '../../../components/list-toolbar';
import { DataTable, type Column } from '../../../components/data-table';
import { FormMessage } from '../../../components/form-field';
import { StateBadge } from '../../../components/state-badge';
import { errorMessage } from '../../../lib/api';
import { useAssignNodes, useNodeCandidates } from '../api/neighbourhoods';

/** Admins: find nodes (server-side search), tick them, move them all into this neighbourhood at once. */
export function BulkNodeAssign({ neighbourhoodId, neighbourhoodNames }: { neighbourhoodId: number; neighbourhoodNames: Map<number, string> }) {
  const [q, setQ] = useState('');
  const [from, setFrom] = useState<string | undefined>(undefined);
  const [state, setState] = useState<string | undefined>(undefined);
  const [page, setPage] = useState(1);
  const [picked, setPicked] = useState<Set<number>>(new Set());
  const candidates = useNodeCandidates({ q: q.trim() || undefined, neighbourhoodId: from, state, page, pageSize: 25, sort: 'name' });
  const assign = useAssignNodes(neighbourhoodId);
  const [done, setDone] = useState<string | null>(null);

  const toggle = (id: number) =>
    setPicked((current) => {
      const next = new Set(current);
      if (next.has(id)) next.delete(id);
      else next.add(id);
      return next;
    });

  const columns: Column<NodeDto>[] = [
    {
      key: 'pick',
      header: 'Move',
      render: (n) => (
        <input
          type="checkbox"
          aria-label={`Move ${n.name}`}
          checked={picked.has(n.id)}
          disabled={n.neighbourhoodId === neighbourhoodId}
          onChange={() => toggle(n.id)}
        />
      ),
    },
    { key: 'name', header: 'Node', render: (n) => n.name },
    { key: 'state', header: 'State', render: (n) => <StateBadge state={n.state} /> },
    { key: 'hood', header: 'Now in', render: (n) => neighbourhoodNames.get(n.neighbourhoodId) ?? `#${n.neighbourhoodId}` },
  ];
  const rows = candidates.data?.data ?? [];
  const total = candidates.data?.pagination.total ?? 0;

  return (
    <div className="space-y-3" data-testid="bulk-node-assign">
      <div className="flex flex-wrap items-end gap-3">
        <label className="block max-w-sm text-sm font-medium">
          Find nodes
          <input
            type="search"
            value={q}
            onChange={(e) => {
              setQ(e.target.value);
              setPage(1);
            }}
            className="mt-1 block w-full rounded-md border border-line-strong bg-surface px-2.5 py-1.5 text-sm"
          />
        </label>
        <FilterSelect
          label="Now in"
          value={from}
          onChange={(v) => {
            setFrom(v);
            setPage(1);
          }}
          options={[...neighbourhoodNames].map(([id, name]) => ({ value: String(id), label: name }))}
        />
        <FilterSelect
          label="State"
          value={state}
          onChange={(v) => {
            setState(v);
            setPage(1);
          }}
          options={NODE_STATES.map((s) => ({ value: s, label: s }))}
        />
      </div>
      <DataTable testId="node-candidates" caption="Nodes to move" rows={rows} columns={columns} rowKey={(n) => n.id} />
      <div className="flex flex-wrap items-center gap-2 text-sm">
        <Button disabled={page <= 1} onClick={() => setPage((p) => p - 1)}>
          Previous
        </Button>
        <span className="text-muted">
          Page {page} of {Math.max(1, Math.ceil(total / 25))}
        </span>
        <Button disabled={page * 25 >= total} onClick={() => setPage((p) => p + 1)}>
          Next
        </Button>
        <Button
          variant="primary"
          disabled={picked.size === 0 || assign.isPending}
          onClick={() =>
            assign.mutate([...picked], {
              onSuccess: (r) => {
                setPicked(new Set());
                setDone(`Moved ${r.moved} node${r.moved === 1 ? '' : 's'}.`);
              },
            })
          }
        >
          Move {picked.size} node{picked.size === 1 ? '' : 's'} here
        </Button>
        <span role="status" className="text-muted">
          {done ?? ''}
        </span>
      </div>
      <FormMessage message={assign.error ? errorMessage(assign.error, 'Could not move the nodes.') : null} />
    </div>
  );
}
