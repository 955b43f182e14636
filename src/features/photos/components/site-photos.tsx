import { useRef, useState } from 'react';
import { Button } from '../../../components/button';
import { EmptyState } from '../../../components/empty-state';
import { FormMessage } from '../../../components/form-field';
import { Section } from '../../../components/page-header';
import { LoadError, Loading } from '../../../components/query-state';
import { errorMessage } from '../../../lib/api';
import { formatDateTime } from '../../../lib/format';
import { useDeletePhoto, useSitePhotos, useUploadPhoto } from '../api/photos';

const errorText = (e: unknown) => (e ? errorMessage(e) : null);

/** Install photos of one site: thumbnails that open the full picture, an upload form, and removal for managers. */
export function SitePhotos({ siteId }: { siteId: number }) {
  const photos = useSitePhotos(siteId);
  const upload = useUploadPhoto(siteId);
  const remove = useDeletePhoto(siteId);
  const [caption, setCaption] = useState('');
  const fileInput = useRef<HTMLInputElement>(null);

  function send(file: File | undefined) {
    if (!file) return;
    upload.mutate(
      { file, caption },
      {
        onSuccess: () => {
          setCaption('');
          if (fileInput.current) fileInput.current.value = '';
        },
      },
    );
  }

  return (
    <Section title="Install photos">
      {photos.isPending ? (
        <Loading label="Loading photos…" />
      ) : photos.isError ? (
        <LoadError error={photos.error} />
      ) : (
        <>
          {photos.data.data.length === 0 ? (
            <EmptyState title="No photos of this install yet" />
          ) : (
            <ul className="grid grid-cols-2 gap-3 sm:grid-cols-3 lg:grid-cols-4" data-testid="site-photos">
              {photos.data.data.map((p) => (
                <li key={p.id} className="overflow-hidden rounded-md border border-line bg-surface">
                  <a href={p.url} target="_blank" rel="noreferrer">
                    <img
                      src={p.thumbnailUrl}
                      alt={p.caption ?? `Install photo taken for this site, added ${formatDateTime(p.createdAt)}`}
                      className="aspect-[4/3] w-full bg-sunken object-cover"
                      loading="lazy"
                    />
                  </a>
                  <div className="flex items-start justify-between gap-2 p-2 text-xs">
                    <span className="min-w-0 break-words">{p.caption ?? formatDateTime(p.createdAt)}</span>
                    {p.abilities.delete && (
                      <button
                        type="button"
                        className="shrink-0 text-danger hover:underline"
                        disabled={remove.isPending}
                        onClick={() => window.confirm('Remove this photo?') && remove.mutate(p.id)}
                      >
                        Remove
                      </button>
                    )}
                  </div>
                </li>
              ))}
            </ul>
          )}
          {photos.data.abilities.create && (
            <div className="mt-3 flex flex-wrap items-end gap-2">
              <label className="text-sm">
                Caption (optional)
                <input
                  value={caption}
                  onChange={(e) => setCaption(e.target.value)}
                  maxLength={200}
                  className="mt-1 block w-64 rounded-md border border-line-strong bg-surface px-2 py-1"
                />
              </label>
              <input
                ref={fileInput}
                type="file"
                accept="image/jpeg,image/png,image/webp"
                className="hidden"
                onChange={(e) => send(e.target.files?.[0])}
                data-testid="photo-file"
              />
              <Button onClick={() => fileInput.current?.click()} disabled={upload.isPending}>
                {upload.isPending ? 'Uploading…' : 'Add a photo'}
              </Button>
              <p className="w-full text-xs text-muted">JPEG, PNG or WebP. Take photos from a safe place: never lean over a roof edge for a picture.</p>
            </div>
          )}
          <FormMessage message={errorText(upload.error) ?? errorText(remove.error)} />
        </>
      )}
    </Section>
  );
}
