// The staff list: one row per person, with a panel under a row for a PIN, an e-mail or a
// deactivation to confirm.
import { flexRender, getCoreRowModel, useReactTable } from '@tanstack/react-table';
import { Fragment, useMemo, useState } from 'react';
import type { Role } from '@/domain/roles';
import type { TeamMember, TeamView } from '@/domain/team-schemas';
import { LINK_HOURS } from '@/domain/team-schemas';
import { ApiError } from '@/lib/http';
import type { TeamCommand, TeamResult } from './commands';
import { PinForm } from './pin-form';
import { DeactivateConfirm, EmailForm } from './row-panels';
import { teamColumns, type RowPanel } from './team-columns';

interface Props {
  view: TeamView;
  busy: boolean;
  run(c: TeamCommand): Promise<TeamResult>;
  notify(message: string, tone?: 'ok' | 'problem'): void;
}

export function TeamTable({ view, busy, run, notify }: Props) {
  const [panel, setPanel] = useState<{ id: number; kind: RowPanel } | null>(null);
  const formatter = useMemo(
    () => new Intl.DateTimeFormat(view.locale, { dateStyle: 'medium', timeStyle: 'short', timeZone: view.timeZone }),
    [view.locale, view.timeZone],
  );

  const attempt = async (c: TeamCommand, ok: (r: TeamResult) => string) => {
    try {
      notify(ok(await run(c)));
    } catch (err) {
      notify(err instanceof ApiError ? err.message : 'That did not work', 'problem');
    }
  };

  // rebuilt each render: cheap, and the cells always see the current busy state and callbacks
  const columns = teamColumns({
    youId: view.youId,
    busy,
    format: (iso) => formatter.format(new Date(iso)),
    setRole: (m: TeamMember, role: Role) =>
      attempt({ kind: 'patch', id: m.id, body: { role } }, () => `${m.name} is now ${role === 'owner' ? 'an' : 'a'} ${role}.`),
    sendLink: (m: TeamMember) =>
      attempt({ kind: 'link', id: m.id, purpose: m.awaitingPassword ? 'invite' : 'reset' }, (r) =>
        r.kind === 'link'
          ? `${r.purpose === 'invite' ? 'A new invitation' : 'A reset link'} went to ${r.to}; it works once, for ${LINK_HOURS} hours, and any older link no longer works.`
          : '',
      ),
    reactivate: (m: TeamMember) => attempt({ kind: 'patch', id: m.id, body: { active: true } }, () => `${m.name} is active again.`),
    open: (m: TeamMember, kind: RowPanel) => setPanel({ id: m.id, kind }),
  });
  const table = useReactTable({ data: view.members, columns, getCoreRowModel: getCoreRowModel(), getRowId: (m) => String(m.id) });
  const done = (message: string) => {
    setPanel(null);
    notify(message);
  };

  return (
    <table className="w-full border-collapse text-left">
      <thead>
        {table.getHeaderGroups().map((g) => (
          <tr key={g.id} className="border-b-2 border-steam-200">
            {g.headers.map((h) => (
              <th key={h.id} scope="col" className="px-3 py-2 text-sm font-semibold tracking-widest text-ink-600 uppercase">
                {flexRender(h.column.columnDef.header, h.getContext())}
              </th>
            ))}
          </tr>
        ))}
      </thead>
      <tbody>
        {table.getRowModel().rows.map((row) => {
          const m = row.original;
          const open = panel?.id === m.id ? panel.kind : null;
          const common = { member: m, run, onDone: done, onCancel: () => setPanel(null) };
          return (
            <Fragment key={row.id}>
              <tr data-testid="team-row" data-username={m.username} className={open ? 'bg-steam-100' : 'border-b border-steam-200'}>
                {row.getVisibleCells().map((cell) => (
                  <td key={cell.id} className="px-3 py-3 align-top">
                    {flexRender(cell.column.columnDef.cell, cell.getContext())}
                  </td>
                ))}
              </tr>
              {open && (
                <tr className="border-b border-steam-200 bg-steam-100">
                  <td colSpan={row.getVisibleCells().length} className="px-3 pb-4">
                    {open === 'pin' && <PinForm {...common} />}
                    {open === 'email' && <EmailForm {...common} />}
                    {open === 'deactivate' && <DeactivateConfirm {...common} isYou={m.id === view.youId} />}
                  </td>
                </tr>
              )}
            </Fragment>
          );
        })}
      </tbody>
    </table>
  );
}
