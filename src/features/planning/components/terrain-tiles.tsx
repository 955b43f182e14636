import { useState, type FormEvent } from 'react';
import { Button } from '../../../components/button';
import { FormMessage } from '../../../components/form-field';
import { errorMessage, type UploadProgress } from '../../../lib/api';
import { useDeleteTerrainTile, useTerrainTiles, useUploadTerrainTile } from '../api/planning';

const say = (e: unknown) => (e ? errorMessage(e) : null);
const percent = (p: UploadProgress | null) => (p?.total ? Math.round((100 * p.loaded) / p.total) : null);

/** The elevation tiles link budgets read their ground from; admins add and remove them. */
export function TerrainTiles() {
  const tiles = useTerrainTiles();
  const [progress, setProgress] = useState<UploadProgress | null>(null);
  const upload = useUploadTerrainTile(setProgress);
  const remove = useDeleteTerrainTile();
  const [file, setFile] = useState<File | null>(null);
  const mayUpload = tiles.data?.abilities.upload ?? false;

  function submit(e: FormEvent) {
    e.preventDefault();
    if (!file) return;
    setProgress(null);
    upload.mutate(file);
  }
  return (
    <div className="space-y-3 rounded-lg border border-line bg-surface p-4" data-testid="terrain-tiles">
      <p className="text-sm">
        {tiles.data?.data.length
          ? `Ground is known under ${tiles.data.data.length} tile(s): `
          : 'No terrain tiles yet: link budgets draw the ground straight between the sites.'}
        {tiles.data?.data.map((t) => (
          <span key={t.name} className="mr-2 inline-flex items-center gap-1 rounded border border-line px-1.5 py-0.5 font-mono text-xs">
            {t.name} ({t.samplesPerSide === 3601 ? '1″' : '3″'})
            {mayUpload && (
              <button type="button" className="underline" aria-label={`Remove tile ${t.name}`} onClick={() => remove.mutate(t.name)}>
                remove
              </button>
            )}
          </span>
        ))}
      </p>
      {mayUpload && (
        <form onSubmit={submit} className="flex flex-wrap items-end gap-3">
          <div>
            <label htmlFor="terrain-file" className="mb-1 block text-sm font-medium">
              SRTM tile (.hgt, unzipped, named like N47W039.hgt)
            </label>
            <input id="terrain-file" type="file" accept=".hgt" className="block text-sm" onChange={(e) => setFile(e.target.files?.[0] ?? null)} />
          </div>
          <Button type="submit" variant="primary" disabled={!file || upload.isPending}>
            {upload.isPending ? `Uploading…${percent(progress) === null ? '' : ` ${percent(progress)} %`}` : 'Upload tile'}
          </Button>
        </form>
      )}
      {upload.isSuccess && (
        <p role="status" className="text-sm">
          Added {upload.data.name}.
        </p>
      )}
      <FormMessage message={say(upload.error) ?? say(remove.error)} />
      <p className="text-xs text-muted">
        SRTM elevation tiles are public-domain data from the Shuttle Radar Topography Mission, offered free by national space and survey agencies; many
        communities keep the few tiles around their town. Tiles show bare ground, not trees or roofs: add those as obstacles.
      </p>
    </div>
  );
}
