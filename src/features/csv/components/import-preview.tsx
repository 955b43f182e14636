import type { ImportPreviewDto } from '../../../../shared/schemas/csvImport';

/** Every row as the server read it, with that row's errors beside it. */
export function ImportPreview({ preview }: { preview: ImportPreviewDto }) {
  return (
    <div className="overflow-x-auto rounded-md border border-line" data-testid="import-preview">
      <table className="w-full text-left text-sm">
        <caption className="sr-only">Rows of the file and their problems</caption>
        <thead className="bg-sunken text-muted">
          <tr>
            <th className="px-2 py-1.5 font-medium">Row</th>
            {preview.columns.map((c) => (
              <th key={c} className="px-2 py-1.5 font-medium">
                {c}
              </th>
            ))}
            <th className="px-2 py-1.5 font-medium">Problems</th>
          </tr>
        </thead>
        <tbody>
          {preview.rows.map((r) => (
            <tr key={r.row} className={`border-t border-line ${r.errors.length ? 'bg-danger-soft' : ''}`} data-testid={`import-row-${r.row}`}>
              <td className="px-2 py-1.5 tabular-nums">{r.row}</td>
              {preview.columns.map((c) => (
                <td key={c} className="max-w-48 truncate px-2 py-1.5" title={r.values[c]}>
                  {r.values[c]}
                </td>
              ))}
              <td className="px-2 py-1.5">
                {r.errors.length === 0 ? (
                  <span className="text-muted">Ready</span>
                ) : (
                  <ul className="space-y-0.5 text-danger">
                    {r.errors.map((e) => (
                      <li key={e.path + e.message}>{e.message.replace(/^rows\.\d+\.?/, '').trim() || e.message}</li>
                    ))}
                  </ul>
                )}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
