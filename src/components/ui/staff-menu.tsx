// Who is signed in, the other screens their role opens, and sign out.
import { useQuery, useQueryClient } from '@tanstack/react-query';
import { Link, useLocation, useNavigate } from 'react-router';
import { can, type Capability } from '../../domain/roles';
import { sessionQuery } from '../../features/session/queries';
import { useApi } from '../../lib/api-context';
import { cn } from '../../lib/cn';
import { http } from '../../lib/http';

const SCREENS: { path: string; label: string; need: Capability }[] = [
  { path: '/counter', label: 'Counter', need: 'takeOrders' },
  { path: '/bar', label: 'Bar', need: 'makeDrinks' },
  { path: '/pickup', label: 'Pickup', need: 'viewPickup' },
  { path: '/pulse', label: 'Pulse', need: 'viewPulse' },
  { path: '/reports', label: 'Reports', need: 'viewReports' },
  { path: '/outbox', label: 'Outbox', need: 'viewOutbox' },
];

export function StaffMenu({ dark = false }: { dark?: boolean }) {
  const api = useApi();
  const { data } = useQuery(sessionQuery(api));
  const qc = useQueryClient();
  const navigate = useNavigate();
  const here = useLocation().pathname;
  const user = data?.user;
  if (!user) return null;
  const signOut = async () => {
    await http('DELETE', '/session').catch(() => undefined);
    qc.clear();
    navigate('/signin', { replace: true });
  };
  return (
    <nav aria-label="Screens" className={cn('flex items-center gap-3 text-base', dark ? 'text-crema-300' : 'text-ink-600')}>
      {SCREENS.filter((s) => s.path !== here && can(user.role, s.need)).map((s) => (
        <Link key={s.path} to={s.path} reloadDocument className="underline underline-offset-4">
          {s.label}
        </Link>
      ))}
      <span className={dark ? 'text-crema-100' : 'text-ink-900'}>{user.name}</span>
      <button type="button" onClick={signOut} className="min-h-11 rounded-lg border border-current px-3 font-semibold">
        Sign out
      </button>
    </nav>
  );
}
