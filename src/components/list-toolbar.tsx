import { useEffect, useId, useRef, useState, type ReactNode } from 'react';

interface ListToolbarProps {
  q: string;
  onSearch: (q: string) => void;
  searchLabel: string;
  /** Shown only on phones, where the table's headers are hidden. */
  sortOptions?: { value: string; label: string }[];
  sort?: string;
  onSort?: (sort: string) => void;
  children?: ReactNode;
}

const CONTROL = 'rounded-md border border-line-strong bg-surface px-2.5 py-1.5 text-sm text-ink';

export function ListToolbar({ q, onSearch, searchLabel, sortOptions, sort, onSort, children }: ListToolbarProps) {
  const searchId = useId();
  const sortId = useId();
  const [text, setText] = useState(q);
  const lastSent = useRef(q);

  // Follow the address when it changes from outside (back button, a shared link).
  useEffect(() => {
    if (q !== lastSent.current) {
      lastSent.current = q;
      setText(q);
    }
  }, [q]);

  // Search as the person types, without a request per keystroke.
  useEffect(() => {
    if (text === lastSent.current) return;
    const timer = window.setTimeout(() => {
      lastSent.current = text;
      onSearch(text);
    }, 300);
    return () => window.clearTimeout(timer);
  }, [text, onSearch]);

  return (
    <div className="mb-3 flex flex-wrap items-end gap-3">
      <div className="min-w-0 grow basis-56">
        <label htmlFor={searchId} className="mb-1 block text-sm font-medium">
          {searchLabel}
        </label>
        <input id={searchId} type="search" value={text} onChange={(event) => setText(event.target.value)} className={`${CONTROL} w-full`} />
      </div>
      {children}
      {sortOptions && onSort && (
        <div className="sm:hidden">
          <label htmlFor={sortId} className="mb-1 block text-sm font-medium">
            Sort by
          </label>
          <select id={sortId} value={sort ?? ''} onChange={(event) => onSort(event.target.value)} className={CONTROL}>
            {sortOptions.map((option) => (
              <option key={option.value} value={option.value}>
                {option.label}
              </option>
            ))}
          </select>
        </div>
      )}
    </div>
  );
}

export function FilterSelect({
  label,
  value,
  onChange,
  options,
  allLabel = 'All',
}: {
  label: string;
  value: string | undefined;
  onChange: (value: string | undefined) => void;
  options: { value: string; label: string }[];
  allLabel?: string;
}) {
  const id = useId();
  return (
    <div>
      <label htmlFor={id} className="mb-1 block text-sm font-medium">
        {label}
      </label>
      <select id={id} value={value ?? ''} onChange={(event) => onChange(event.target.value || undefined)} className={`${CONTROL} max-w-56`}>
        <option value="">{allLabel}</option>
        {options.map((option) => (
          <option key={option.value} value={option.value}>
            {option.label}
          </option>
        ))}
      </select>
    </div>
  );
}

/** "Name A–Z" / "Name Z–A" pairs for the phone sort menu. */
export function sortChoices(fields: { key: string; label: string }[]): { value: string; label: string }[] {
  return fields.flatMap(({ key, label }) => [
    { value: key, label: `${label} ↑` },
    { value: `-${key}`, label: `${label} ↓` },
  ]);
}
