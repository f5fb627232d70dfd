import { useEffect, useMemo, useState } from 'react';
import type { RevisionDetail } from '../../../../shared/api/revisions.js';
import { isModelThumbnailFileName } from '../../../../shared/engine/thumbnail.js';
import { buttonClasses } from '../../../components/ui/button.js';
import { formatBytes } from '../../../components/ui/file-field.js';
import { revisionTemplateUrl } from '../api/get-revision.js';

/** A download link for the revision's design document, made in the browser from the stored JSON. */
function useJsonDownload(value: unknown): string | null {
  const url = useMemo(() => (value === undefined || value === null ? null : URL.createObjectURL(new Blob([JSON.stringify(value, null, 2)], { type: 'application/json' }))), [value]);
  useEffect(() => () => (url ? URL.revokeObjectURL(url) : undefined), [url]);
  return url;
}

/** Downloads of a revision: its design JSON, its stored files and a drawing template per family. */
export function RevisionDownloads({ revision }: { revision: RevisionDetail }) {
  const designUrl = useJsonDownload(revision.design);
  const files = revision.files.filter((f) => f.role !== 'thumbnail' && f.role !== 'photo');
  return (
    <div className="space-y-4">
      <div className="flex flex-wrap gap-2">
        {designUrl ? (
          <a href={designUrl} download={`revision-${revision.number}.design.json`} className={buttonClasses('secondary', 'sm')}>
            Download the design JSON
          </a>
        ) : null}
      </div>
      {files.length > 0 ? (
        <div>
          <h3 className="mb-1 text-sm font-semibold">Uploaded files</h3>
          <ul className="space-y-1 text-sm">
            {files.map((f) => (
              <li key={f.id}>
                <a href={f.url} download={f.originalName}>
                  {f.originalName}
                </a>{' '}
                <span className="font-mono text-xs text-ink-soft">
                  {f.role} · {formatBytes(f.size)}
                </span>
              </li>
            ))}
          </ul>
        </div>
      ) : null}
      {revision.templateFamilies.length > 0 ? (
        <div>
          <h3 className="mb-1 text-sm font-semibold">Drawing templates of this revision</h3>
          <p className="mb-2 text-sm text-ink-soft">Each family's plane with the traces of the others and the joint lines marked; draw the next motif on it and upload it back.</p>
          <ul className="flex flex-wrap gap-2">
            {revision.templateFamilies.map((f) => (
              <li key={f.id}>
                <a href={revisionTemplateUrl(revision.id, f.id)} download className={buttonClasses('secondary', 'sm')} aria-label={`Download the drawing template of family ${f.label}`}>
                  {f.label} (SVG)
                </a>
              </li>
            ))}
          </ul>
        </div>
      ) : null}
    </div>
  );
}

/** Thumbnails of the photos of the built piece, each linking to the full photo. */
export function PhotoThumbnails({ revision }: { revision: RevisionDetail }) {
  const photos = revision.files.filter((f) => f.role === 'photo');
  // The model's own picture is a thumbnail file too (server/thumbnails); it is no photo.
  const thumbs = revision.files.filter((f) => f.role === 'thumbnail' && !isModelThumbnailFileName(f.originalName));
  const [broken, setBroken] = useState<Set<number>>(new Set());
  if (photos.length === 0 && thumbs.length === 0) return <p className="text-sm text-ink-soft">No photos with this revision.</p>;
  const pairs = (photos.length ? photos : thumbs).map((p, i) => ({ photo: p, thumb: thumbs[i] ?? p }));
  return (
    <ul className="flex flex-wrap gap-3" aria-label="Photos">
      {pairs.map(({ photo, thumb }, i) => (
        <li key={photo.id}>
          <a href={photo.url} target="_blank" rel="noopener noreferrer" className="block rounded-md border border-rule bg-paper-raised p-1">
            {broken.has(thumb.id) ? (
              <span className="flex h-24 w-32 items-center justify-center text-xs text-ink-soft">Photo {i + 1}</span>
            ) : (
              <img
                src={thumb.url}
                alt={`Photo ${i + 1} of the built piece (${photo.originalName})`}
                className="h-24 w-auto rounded-sm object-cover"
                loading="lazy"
                onError={() => setBroken((s) => new Set(s).add(thumb.id))}
              />
            )}
          </a>
        </li>
      ))}
    </ul>
  );
}
