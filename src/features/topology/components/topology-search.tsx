import { memo, useId, useMemo, useState, type FormEvent } from 'react';
import { Button } from '../../../components/button';
import type { TopologyNode } from '../api/topology';

/** An exact name first, then the first name or site containing the text. */
export function findNode(nodes: TopologyNode[], text: string): TopologyNode | undefined {
  const wanted = text.trim().toLowerCase();
  if (!wanted) return undefined;
  return (
    nodes.find((n) => n.name.toLowerCase() === wanted) ??
    nodes.find((n) => n.name.toLowerCase().includes(wanted)) ??
    nodes.find((n) => n.siteName.toLowerCase().includes(wanted))
  );
}

export const TopologySearch = memo(function TopologySearch({ nodes, onFind }: { nodes: TopologyNode[]; onFind: (node: TopologyNode) => void }) {
  const inputId = useId();
  const listId = useId();
  const [text, setText] = useState('');
  const [message, setMessage] = useState<string | null>(null);
  // The map hands over a list that keeps its identity while names and places stay: live events do not redraw 2,000 options.
  const suggestions = useMemo(() => nodes.map((node) => <option key={node.id} value={node.name} />), [nodes]);

  function submit(event: FormEvent) {
    event.preventDefault();
    const node = findNode(nodes, text);
    if (!node) {
      setMessage(text.trim() ? `No node or site matches “${text.trim()}”.` : 'Type a node or site name.');
      return;
    }
    setMessage(null);
    onFind(node);
  }

  return (
    <form role="search" onSubmit={submit} className="min-w-0 grow basis-56">
      <label htmlFor={inputId} className="mb-1 block text-sm font-medium">
        Find a node
      </label>
      <div className="flex gap-2">
        <input
          id={inputId}
          type="search"
          list={listId}
          value={text}
          placeholder="Name or site"
          onChange={(event) => setText(event.target.value)}
          aria-describedby={message ? `${inputId}-message` : undefined}
          className="w-full min-w-0 rounded-md border border-line-strong bg-surface px-2.5 py-1.5 text-sm text-ink"
        />
        <Button type="submit">Find</Button>
      </div>
      <datalist id={listId}>{suggestions}</datalist>
      <p id={`${inputId}-message`} aria-live="polite" className="mt-1 text-sm text-danger empty:hidden">
        {message ?? ''}
      </p>
    </form>
  );
});
