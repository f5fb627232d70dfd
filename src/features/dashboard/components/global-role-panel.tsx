import { Link } from 'react-router-dom';
import type { GlobalRole } from '../../../../shared/api/roles.js';
import { Card, CardHeader } from '../../../components/ui/card.js';
import { RoleBadge } from '../../../components/ui/role-badge.js';

const ADMIN_LINKS = [
  { to: '/admin/users', label: 'Users', text: 'global roles, memberships, last sign-in' },
  { to: '/admin/studios', label: 'All studios', text: 'every studio; create a new one' },
  { to: '/admin/materials', label: 'Material catalogue', text: 'thickness, kerf, cutting speed; prohibited materials and why' },
  { to: '/admin/outbox', label: 'Outbox', text: 'mail the server has sent' },
];

/** What a global role gives on top of studio work. */
export function GlobalRolePanel({ role }: { role: GlobalRole }) {
  return (
    <Card aria-labelledby="global-role-heading">
      <CardHeader
        id="global-role-heading"
        title={
          <span className="inline-flex items-center gap-3">
            Maker-space role <RoleBadge role={role} />
          </span>
        }
        description={
          role === 'admin'
            ? 'You look after the people, the studios, the materials and the mail of this maker space.'
            : 'You run the laser. Approved designs reach you as cut packs in the cut queue.'
        }
      />
      {role === 'admin' ? (
        <ul className="space-y-2 text-sm">
          {ADMIN_LINKS.map((link) => (
            <li key={link.to}>
              <Link to={link.to} className="font-medium">
                {link.label}
              </Link>{' '}
              <span className="text-ink-soft">— {link.text}</span>
            </li>
          ))}
        </ul>
      ) : (
        <p className="text-sm text-ink-soft">
          The cut queue is not built yet; it arrives together with cut packs. Until then there is nothing waiting for you.
        </p>
      )}
    </Card>
  );
}
