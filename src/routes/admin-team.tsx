// Team (back office, owner): who works here, their roles, invitation and reset links, PINs.
import { useSuspenseQuery } from '@tanstack/react-query';
import { useState } from 'react';
import type { LoaderFunctionArgs } from 'react-router';
import { SCREENS } from '@/domain/screens';
import { PIN_LOCK_MINUTES, PIN_TRIES } from '@/domain/team-schemas';
import { StaffMenu } from '@/features/team/staff-menu';
import { AddPersonForm } from '@/features/team/add-person-form';
import { useTeamCommand } from '@/features/team/commands';
import { teamQuery } from '@/queries/team';
import { TeamTable } from '@/features/team/team-table';
import { useApi } from '@/lib/api-context';
import { cn } from '@/lib/cn';
import { plural } from '@/domain/plural';
import { requireScreen, type RouteDeps } from './deps';

function AdminTeam() {
  const { data: view } = useSuspenseQuery(teamQuery(useApi()));
  const command = useTeamCommand();
  const [notice, setNotice] = useState<{ message: string; tone: 'ok' | 'problem' } | null>(null);
  const notify = (message: string, tone: 'ok' | 'problem' = 'ok') => setNotice({ message, tone });
  const active = view.members.filter((m) => m.active).length;

  return (
    <div className="min-h-screen bg-steam-50 p-5 text-ink-900">
      <header className="flex items-center gap-5">
        <h1 className="text-3xl font-semibold">Team</h1>
        <span className="text-lg text-ink-600">
          {plural(view.members.length, 'person', 'people')} · {active} active
        </span>
        <div className="ml-auto">
          <StaffMenu />
        </div>
      </header>
      <p
        role="status"
        className={cn(
          'mt-4 min-h-14 rounded-xl border-2 px-4 py-3 text-lg',
          !notice && 'border-transparent',
          notice?.tone === 'ok' && 'border-ink-900 bg-white',
          notice?.tone === 'problem' && 'border-copper-700 bg-white font-semibold text-copper-700',
        )}
      >
        {notice && (notice.tone === 'problem' ? `⚠ ${notice.message}` : `✓ ${notice.message}`)}
      </p>
      <div className="mt-4 grid grid-cols-1 items-start gap-5 xl:grid-cols-[minmax(0,1fr)_24rem]">
        <section aria-label="Staff" tabIndex={0} className="relative overflow-x-auto rounded-xl border border-steam-200 bg-white p-4">
          <TeamTable view={view} busy={command.isPending} run={command.mutateAsync} notify={notify} />
        </section>
        <aside className="flex flex-col gap-4">
          <AddPersonForm run={command.mutateAsync} onDone={notify} />
          <section aria-labelledby="pins-heading" className="rounded-xl border border-steam-200 bg-white p-5 text-base">
            <h2 id="pins-heading" className="text-lg font-semibold">
              Switch person by PIN
            </h2>
            <p className="mt-1">
              On a shared terminal, "Switch person" in the staff menu lets someone with a PIN take over without the password. After {PIN_TRIES} wrong PINs that
              person's PIN locks for {PIN_LOCK_MINUTES} minutes. Tell people their PIN in person; everyone can change their own.
            </p>
            <p className="mt-2">A reset link leaves the old password working until the new one is set. To shut someone out at once, deactivate them.</p>
          </section>
        </aside>
      </div>
    </div>
  );
}

export const adminTeamRoute = (deps: RouteDeps) => ({
  Component: AdminTeam,
  handle: { title: 'Team' },
  loader: async ({ request }: LoaderFunctionArgs) => {
    await requireScreen(deps, request, SCREENS.adminTeam.need);
    await deps.queryClient.ensureQueryData(teamQuery(deps.api));
    return null;
  },
});
