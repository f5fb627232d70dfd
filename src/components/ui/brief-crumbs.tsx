import { Link } from 'react-router-dom';

/** The eyebrow of a page inside a brief: its studio, then the brief, each a link. */
export function BriefCrumbs({ studio, briefId, briefTitle }: { studio: { id: number; name: string }; briefId: number; briefTitle: string }) {
  return (
    <span className="flex flex-wrap gap-2">
      <Link to={`/studios/${studio.id}`}>{studio.name}</Link>
      <span aria-hidden="true">/</span>
      <Link to={`/briefs/${briefId}`}>{briefTitle}</Link>
    </span>
  );
}
