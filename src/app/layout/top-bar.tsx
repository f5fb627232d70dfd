import { Link, NavLink, useLocation, useNavigate } from 'react-router-dom';
import type { SessionUser } from '../../../shared/api/auth.js';
import { Button } from '../../components/ui/button.js';
import { cn } from '../../components/ui/cn.js';
import { RoleBadge } from '../../components/ui/role-badge.js';
import { useSignOut } from '../../features/auth/api/sign-out.js';
import { BrandMark } from './brand-mark.js';

interface NavItem {
  to: string;
  label: string;
  end?: boolean;
}

function navFor(user: SessionUser): NavItem[] {
  const items: NavItem[] = [{ to: '/', label: 'My studios', end: true }];
  if (user.globalRole === 'admin') {
    items.push(
      { to: '/admin/users', label: 'Users' },
      { to: '/admin/studios', label: 'All studios' },
      { to: '/admin/materials', label: 'Materials' },
      { to: '/admin/outbox', label: 'Outbox' },
    );
  }
  items.push({ to: '/settings/notifications', label: 'Notifications' });
  return items;
}

/** Signs out and goes to `to` (the sign-in page unless told). */
export function SignOutButton({ size = 'sm', to = '/sign-in' }: { size?: 'sm' | 'md'; to?: string }) {
  const navigate = useNavigate();
  const signOut = useSignOut(() => navigate(to, { replace: true }));
  return (
    <Button variant="secondary" size={size} pending={signOut.isPending} pendingLabel="Signing out…" onClick={() => signOut.mutate()}>
      Sign out
    </Button>
  );
}

export function TopBar({ user }: { user: SessionUser | null }) {
  const { pathname } = useLocation();
  return (
    <header className="border-b border-rule bg-paper-raised/90 backdrop-blur-sm">
      <div className="mx-auto flex max-w-sheet flex-wrap items-center gap-x-6 gap-y-2 px-5 py-3 sm:px-8">
        <Link to="/" className="flex items-center gap-2 text-ink no-underline hover:text-ink" aria-label="Planewright, home">
          <BrandMark className="size-7" />
          <span className="text-lg font-semibold tracking-tight">Planewright</span>
        </Link>
        {user ? (
          <nav aria-label="Main" className="order-3 w-full sm:order-none sm:w-auto">
            <ul className="flex flex-wrap items-center gap-1">
              {navFor(user).map((item) => (
                <li key={item.to}>
                  <NavLink
                    to={item.to}
                    end={item.end}
                    className={({ isActive }) =>
                      cn(
                        'block rounded-md px-3 py-1.5 text-sm font-medium no-underline',
                        isActive ? 'bg-accent-wash text-accent-strong' : 'text-ink-soft hover:bg-paper-sunk hover:text-ink',
                      )
                    }
                  >
                    {item.label}
                  </NavLink>
                </li>
              ))}
            </ul>
          </nav>
        ) : null}
        <div className="ml-auto flex items-center gap-3">
          {user ? (
            <>
              <span className="hidden text-right text-sm leading-tight sm:block">
                <span className="block font-medium" data-testid="signed-in-name">
                  {user.name}
                </span>
                <span className="block font-mono text-xs text-ink-soft">{user.email}</span>
              </span>
              {user.globalRole ? <RoleBadge role={user.globalRole} /> : null}
              <SignOutButton />
            </>
          ) : pathname === '/sign-in' ? null : (
            <NavLink to="/sign-in" className="text-sm font-medium">
              Sign in
            </NavLink>
          )}
        </div>
      </div>
    </header>
  );
}
