import { Link } from 'react-router-dom';
import type { Studio } from '../../../../shared/api/studios.js';
import { RoleBadge } from '../../../components/ui/role-badge.js';

/** The studios a person belongs to, each with the role they hold there. */
export function StudioCards({ studios }: { studios: Studio[] }) {
  return (
    <ul className="grid gap-4 sm:grid-cols-2 lg:grid-cols-3" aria-label="My studios">
      {studios.map((studio) => (
        <li key={studio.id}>
          <Link
            to={`/studios/${studio.id}`}
            className="group flex h-full flex-col gap-3 rounded-lg border border-rule bg-paper-raised p-5 text-ink no-underline shadow-[0_1px_0_rgb(31_42_51/0.06)] transition-colors hover:border-accent hover:text-ink"
          >
            <span className="flex items-start justify-between gap-3">
              <span className="text-lg font-semibold group-hover:text-accent-strong">{studio.name}</span>
              {studio.myRole ? <RoleBadge role={studio.myRole} /> : null}
            </span>
            {studio.description ? (
              <span className="line-clamp-3 text-sm text-ink-soft">{studio.description}</span>
            ) : null}
            <span className="mt-auto font-mono text-xs text-ink-soft">
              {studio.memberCount} {studio.memberCount === 1 ? 'member' : 'members'}
            </span>
          </Link>
        </li>
      ))}
    </ul>
  );
}
