import { useState } from 'react';
import { useSearchParams } from 'react-router-dom';
import { NODE_CSV_COLUMNS, SITE_CSV_COLUMNS, type ImportKind } from '../../shared/schemas/csvImport';
import { Button, ButtonLink } from '../components/button';
import { FormMessage } from '../components/form-field';
import { PageHeader, Section } from '../components/page-header';
import { useCommitImport, usePreviewImport } from '../features/csv/api/csv';
import { ImportPreview } from '../features/csv/components/import-preview';
import { errorMessage } from '../lib/api';
import { paths } from '../lib/paths';

const LAYOUT = { sites: SITE_CSV_COLUMNS, nodes: NODE_CSV_COLUMNS };
const message = (e: unknown) => (e ? errorMessage(e) : null);

export function ImportsPage() {
  const [search, setSearch] = useSearchParams();
  const kind: ImportKind = search.get('kind') === 'nodes' ? 'nodes' : 'sites';
  const [file, setFile] = useState<File | null>(null);
  const preview = usePreviewImport(kind);
  const commit = useCommitImport(kind);

  function choose(next: File | null) {
    setFile(next);
    preview.reset();
    commit.reset();
    if (next) preview.mutate(next);
  }

  return (
    <>
      <PageHeader title="Import from CSV" subtitle="Add many sites or nodes at once. Nothing is saved until every row is right." />
      <div className="mb-4 flex flex-wrap gap-2" role="group" aria-label="What to import">
        {(['sites', 'nodes'] as const).map((k) => (
          <Button
            key={k}
            variant={k === kind ? 'primary' : 'secondary'}
            aria-pressed={k === kind}
            onClick={() => {
              setSearch({ kind: k });
              choose(null);
            }}
          >
            {k === 'sites' ? 'Sites' : 'Nodes'}
          </Button>
        ))}
      </div>
      <p className="mb-2 text-sm">
        The first line names the columns: <code className="rounded bg-sunken px-1">{LAYOUT[kind].join(',')}</code>.{' '}
        {kind === 'sites'
          ? 'Name the neighbourhood; latitude and longitude in decimal degrees; heights in metres.'
          : 'Name the site; the node joins the site’s neighbourhood. Report interval in seconds (default 60).'}
      </p>
      <label className="mb-4 block text-sm font-medium">
        CSV file
        <input
          key={kind}
          type="file"
          accept=".csv,text/csv"
          className="mt-1 block w-full text-sm"
          data-testid="import-file"
          onChange={(e) => choose(e.target.files?.[0] ?? null)}
        />
      </label>
      <FormMessage message={message(preview.error) ?? message(commit.error)} />
      {preview.isPending && (
        <p role="status" className="text-sm text-muted">
          Checking the file…
        </p>
      )}
      {commit.isSuccess ? (
        <div role="status" className="rounded-md border border-line bg-accent-soft px-3 py-2 text-sm" data-testid="import-done">
          Imported {commit.data.created} {kind}.{' '}
          <ButtonLink variant="quiet" to={kind === 'sites' ? paths.sites.to() : paths.nodes.to()}>
            Open the {kind} list
          </ButtonLink>
        </div>
      ) : (
        preview.data && (
          <Section title="Preview">
            <p className="mb-2 text-sm" data-testid="import-summary">
              {preview.data.errorCount === 0
                ? `All ${preview.data.validCount} rows are ready.`
                : `${preview.data.errorCount} of ${preview.data.rows.length} rows have problems. ` +
                  'Fix them in the file and choose it again; nothing is imported until every row is right.'}
            </p>
            <ImportPreview preview={preview.data} />
            <div className="mt-3">
              <Button variant="primary" disabled={!file || preview.data.errorCount > 0 || commit.isPending} onClick={() => file && commit.mutate(file)}>
                Import {preview.data.rows.length} {kind}
              </Button>
            </div>
          </Section>
        )
      )}
    </>
  );
}
