import { buttonClass } from '../../../components/button';
import { exportUrl } from '../api/csv';

/** A plain download link: the browser saves the server's CSV of everything the caller may read. */
export function ExportButton({ table, label = 'Download CSV' }: { table: 'sites' | 'nodes' | 'radios' | 'links'; label?: string }) {
  return (
    <a href={exportUrl(table)} download className={buttonClass('secondary')} data-testid={`export-${table}`}>
      {label}
    </a>
  );
}
