// Who is signed in, the other screens their role opens, an owner's café of the group, and sign out.
import { useQuery } from '@tanstack/react-query';
import { Link, useLocation } from 'react-router';
import { can } from '@/domain/roles';
import { SCREENS } from '@/domain/screens';
import { sessionQuery } from '@/queries/session';
import { CafeChoice } from './cafe-choice';
import { SwitchPersonButton } from './switch-person-button';
import { useApi } from '@/lib/api-context';
import { cn } from '@/lib/cn';
import { signOut } from '@/lib/http';
import { confirmLeave } from '@/lib/leave-guard';

const MENU = [
  SCREENS.counter,
  SCREENS.bar,
  SCREENS.pickup,
  SCREENS.pulse,
  SCREENS.reports,
  SCREENS.cardCheck,
  SCREENS.dialIn,
  SCREENS.adminMenu,
  SCREENS.adminTeam,
  SCREENS.adminBeans,
  SCREENS.adminSettings,
  SCREENS.outbox,
];

export function StaffMenu({ dark = false }: { dark?: boolean }) {
  const api = useApi();
  const { data } = useQuery(sessionQuery(api));
  const here = useLocation().pathname;
  const user = data?.user;
  if (!user) return null;
  const onSignOut = () => {
    if (confirmLeave()) void signOut();
  };
  return (
    <nav
      aria-label="Screens"
      className={cn('flex max-w-full flex-wrap items-center gap-x-3 gap-y-2 text-base whitespace-nowrap', dark ? 'text-crema-300' : 'text-ink-600')}
    >
      {MENU.filter((s) => s.path !== here && can(user.role, s.need)).map((s) => (
        <Link
          key={s.path}
          to={s.path}
          reloadDocument
          onClick={(e) => confirmLeave() || e.preventDefault()}
          className="whitespace-nowrap underline underline-offset-4"
        >
          {s.label}
        </Link>
      ))}
      {data && <CafeChoice session={data} dark={dark} />}
      <span className={cn('whitespace-nowrap', dark ? 'text-crema-100' : 'text-ink-900')}>{user.name}</span>
      <SwitchPersonButton className="min-h-11 rounded-lg border border-current px-3 font-semibold whitespace-nowrap" />
      <button type="button" onClick={onSignOut} className="min-h-11 rounded-lg border border-current px-3 font-semibold whitespace-nowrap">
        Sign out
      </button>
    </nav>
  );
}
