import { Link } from 'react-router-dom';

export interface Total {
  label: string;
  value: number;
  to: string;
}

export function Totals({ totals }: { totals: Total[] }) {
  return (
    <dl className="grid gap-2 sm:grid-cols-3 sm:gap-3">
      {totals.map((total) => (
        <div key={total.label} className="flex items-baseline justify-between rounded-lg border border-line bg-surface px-3 py-2 sm:block sm:p-4">
          <dt className="text-sm text-muted">{total.label}</dt>
          <dd className="text-xl font-semibold sm:mt-1 sm:text-3xl tabular-nums">
            <Link to={total.to} className="rounded hover:underline">
              {total.value}
            </Link>
          </dd>
        </div>
      ))}
    </dl>
  );
}
