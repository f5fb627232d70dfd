import { useState } from 'react';
import { cn } from './cn.js';

/** `GET /api/revisions/:revisionId/thumbnail`: a small PNG of the model (404 while there is none). */
export function revisionThumbnailUrl(revisionId: number): string {
  return `/api/revisions/${revisionId}/thumbnail`;
}

const SIZES = { sm: 'size-12', md: 'size-20' } as const;
const PIXELS = { sm: 48, md: 80 } as const;

/**
 * A revision's picture at a fixed size, loaded lazily. When there is none yet (or it fails to
 * load) a quiet drafting mark of the same size takes its place, so rows do not jump, and the
 * text alternative says there is no picture.
 */
export function RevisionThumbnail({ revisionId, alt, size = 'sm', className }: { revisionId: number; alt: string; size?: keyof typeof SIZES; className?: string }) {
  const [failedFor, setFailedFor] = useState<number | null>(null);
  const frame = cn('inline-block shrink-0 rounded-sm border border-rule bg-paper-sunk', SIZES[size], className);
  if (failedFor === revisionId) {
    return (
      <span role="img" aria-label={`${alt} (no picture yet)`} data-thumbnail="missing" className={cn(frame, 'grid place-items-center text-ink-faint')}>
        <svg aria-hidden="true" viewBox="0 0 24 24" className="size-1/2">
          <path d="M3 17 12 21 21 17 12 13Z M12 3v18 M12 3l6 2v8" fill="none" stroke="currentColor" strokeWidth="1.2" strokeLinejoin="round" />
        </svg>
      </span>
    );
  }
  return (
    <img
      src={revisionThumbnailUrl(revisionId)}
      alt={alt}
      loading="lazy"
      decoding="async"
      width={PIXELS[size]}
      height={PIXELS[size]}
      onError={() => setFailedFor(revisionId)}
      className={cn(frame, 'object-contain')}
    />
  );
}
