import { useState, type FormEvent } from 'react';
import { Button } from '../../../components/button';
import { FormMessage, SelectField } from '../../../components/form-field';
import { ApiError } from '../../../lib/api';
import { useNodeChoices } from '../api/inventory';
import { useUploadSurvey } from '../api/planning';

/** Upload one node's site survey; good rows are kept and each bad row is listed with its line. */
export function SurveyUpload() {
  const nodes = useNodeChoices();
  const upload = useUploadSurvey();
  const [nodeId, setNodeId] = useState('');
  const [file, setFile] = useState<File | null>(null);

  function submit(e: FormEvent) {
    e.preventDefault();
    if (nodeId && file) upload.mutate({ nodeId: Number(nodeId), file });
  }
  const error = upload.error instanceof ApiError ? upload.error : null;

  return (
    <form onSubmit={submit} className="space-y-3 rounded-lg border border-line bg-surface p-4" data-testid="survey-upload">
      <div className="grid gap-3 sm:grid-cols-2">
        <SelectField
          label="Node surveyed"
          value={nodeId}
          onChange={(e) => setNodeId(e.target.value)}
          placeholder="Choose a node"
          options={(nodes.data ?? []).map((n) => ({ value: String(n.id), label: n.name }))}
        />
        <div>
          <label htmlFor="survey-file" className="mb-1 block text-sm font-medium">
            Survey file (CSV, up to 1 MB)
          </label>
          <input id="survey-file" type="file" accept=".csv,text/csv" className="block w-full text-sm" onChange={(e) => setFile(e.target.files?.[0] ?? null)} />
        </div>
      </div>
      <p className="text-xs text-muted">
        One network heard per row under a header naming the columns in any order: <code>ssid,channel,channelWidthMHz,signalDbm</code> (and <code>band</code>,
        optional). Channel 1–14 or 32–196; width 20, 22, 40, 80 or 160 (20 if empty); signal −120 to 0 dBm. Example row: <code>Cafe Guest,6,20,-71</code>.
      </p>
      <Button type="submit" variant="primary" disabled={!nodeId || !file || upload.isPending}>
        {upload.isPending ? 'Uploading…' : 'Upload survey'}
      </Button>
      {upload.isSuccess && (
        <div role="status" className="text-sm">
          <p>
            Kept {upload.data.data.rowCount} networks from {upload.data.data.fileName ?? 'the file'}.
          </p>
          {upload.data.rejectedRows.length > 0 && <RejectedRows rows={upload.data.rejectedRows} />}
        </div>
      )}
      {error && (
        <>
          <FormMessage message={error.message} />
          {error.details.length > 1 && (
            <RejectedRows rows={error.details.map((d) => ({ line: Number(d.path.split('.')[1]), message: d.message.replace(/^line \d+: /, '') }))} />
          )}
        </>
      )}
    </form>
  );
}

function RejectedRows({ rows }: { rows: { line: number; message: string }[] }) {
  return (
    <div className="mt-2">
      <p className="font-medium">Rows left out — fix them and upload again:</p>
      <ul className="mt-1 max-h-48 list-disc overflow-auto pl-5 text-sm">
        {rows.map((r) => (
          <li key={`${r.line}-${r.message}`}>
            Line {r.line}: {r.message}
          </li>
        ))}
      </ul>
    </div>
  );
}
