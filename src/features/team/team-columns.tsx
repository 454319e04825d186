// The Team table's columns: who, role, e-mail, account state, PIN, and what the owner can do.
import { createColumnHelper } from '@tanstack/react-table';
import { ROLES, type Role } from '@/domain/roles';
import type { TeamMember } from '@/domain/team-schemas';
import { Button } from '@/components/ui/button';
import { cn } from '@/lib/cn';

export type RowPanel = 'pin' | 'email' | 'deactivate';

export interface ColumnContext {
  youId: number;
  busy: boolean;
  format(iso: string): string;
  setRole(m: TeamMember, role: Role): void;
  sendLink(m: TeamMember): void;
  reactivate(m: TeamMember): void;
  open(m: TeamMember, panel: RowPanel): void;
}

const col = createColumnHelper<TeamMember>();
const badge = 'inline-flex items-center gap-1 rounded-md border px-2 py-0.5 text-base font-semibold';

function Status({ m, format }: { m: TeamMember; format(iso: string): string }) {
  if (!m.active) return <span className={cn(badge, 'border-ink-600 text-ink-600')}>○ Inactive</span>;
  const link = m.link;
  const linkLine = link
    ? link.expired
      ? `${link.purpose === 'invite' ? 'Invitation' : 'Reset link'} expired ${format(link.expiresAt)}`
      : link.sentAt
        ? `${link.purpose === 'invite' ? 'Invitation' : 'Reset link'} sent ${format(link.sentAt)}, works until ${format(link.expiresAt)}`
        : `${link.purpose === 'invite' ? 'Invitation' : 'Reset link'} not sent: the mail server did not take it`
    : null;
  return (
    <div>
      {m.awaitingPassword ? (
        <span className={cn(badge, 'border-copper-700 text-copper-700')}>✉ Invited · no password yet</span>
      ) : (
        <span className={cn(badge, 'border-ink-900 text-ink-900')}>● Active</span>
      )}
      {linkLine && <p className="mt-1 max-w-72 text-sm text-ink-600">{linkLine}</p>}
      <p className="mt-1 text-base">{m.hasPin ? '✓ Switch PIN set' : '— No switch PIN'}</p>
    </div>
  );
}

export function teamColumns(c: ColumnContext) {
  return [
    col.accessor('name', {
      header: 'Person',
      cell: ({ row: { original: m } }) => (
        <div>
          <span className="text-lg font-semibold whitespace-nowrap">{m.name}</span>
          {m.id === c.youId && <span className="ml-2 rounded bg-steam-200 px-1.5 text-sm font-semibold">you</span>}
          <p className="text-base text-ink-600">
            sign-in <span className="font-semibold text-ink-900">{m.username}</span>
          </p>
        </div>
      ),
    }),
    col.accessor('role', {
      header: 'Role',
      cell: ({ row: { original: m } }) => (
        <select
          aria-label={`Role of ${m.name}`}
          value={m.role}
          disabled={c.busy || !m.active}
          onChange={(e) => c.setRole(m, e.target.value as Role)}
          className="min-h-11 rounded-lg border border-steam-200 bg-white px-2 text-base font-semibold capitalize"
        >
          {ROLES.map((r) => (
            <option key={r} value={r}>
              {r}
            </option>
          ))}
        </select>
      ),
    }),
    col.accessor('email', {
      header: 'E-mail',
      cell: ({ row: { original: m } }) => (
        <button
          type="button"
          onClick={() => c.open(m, 'email')}
          aria-label={`E-mail of ${m.name}: ${m.email ?? 'none'}. Change`}
          className="min-h-11 text-left text-base [overflow-wrap:anywhere] underline-offset-4 hover:underline"
        >
          {m.email ?? <span className="text-ink-600 italic">none — add one</span>}
        </button>
      ),
    }),
    col.display({ id: 'status', header: 'Account', cell: ({ row: { original: m } }) => <Status m={m} format={c.format} /> }),
    col.display({
      id: 'actions',
      header: () => <span className="sr-only">Actions</span>,
      cell: ({ row: { original: m } }) => (
        <div className="flex justify-end gap-2 whitespace-nowrap">
          {m.active && m.email && (
            <Button tone="quiet" disabled={c.busy} onClick={() => c.sendLink(m)}>
              {m.awaitingPassword ? 'Resend invitation' : 'Send reset link'}
            </Button>
          )}
          <Button tone="quiet" disabled={c.busy} onClick={() => c.open(m, 'pin')}>
            {m.hasPin ? 'Change PIN' : 'Set PIN'}
          </Button>
          {m.active ? (
            <Button tone="quiet" disabled={c.busy} onClick={() => c.open(m, 'deactivate')}>
              Deactivate
            </Button>
          ) : (
            <Button tone="quiet" disabled={c.busy} onClick={() => c.reactivate(m)}>
              Reactivate
            </Button>
          )}
        </div>
      ),
    }),
  ];
}
