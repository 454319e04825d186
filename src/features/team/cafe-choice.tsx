// The staff menu's café chooser, for an owner whose group holds more than one café. Choosing
// moves this session (every tab of it) to that café; the page loads again, since everything on
// it (menu, board, reports) belongs to the café it came from. Other people never see it: they
// work on their own café.
import { useState } from 'react';
import type { SessionView } from '@/domain/types';
import { send } from '@/lib/commands';
import { cn } from '@/lib/cn';
import { confirmLeave } from '@/lib/leave-guard';

export function CafeChoice({ session, dark }: { session: SessionView; dark: boolean }) {
  const [failed, setFailed] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  if (session.groupCafes.length < 2 || !session.cafe) return null;
  const current = session.cafe.id;

  const choose = async (locationId: number) => {
    if (locationId === current || !confirmLeave()) return;
    setBusy(true);
    setFailed(null);
    try {
      await send.chooseCafe({ locationId });
      window.location.reload();
    } catch (err) {
      setBusy(false);
      setFailed(err instanceof Error ? err.message : 'Could not change café');
    }
  };

  return (
    // on a phone the choice shrinks with the screen (a long café name is cut in the closed select,
    // whole in its list) rather than widen the page
    <label className="flex max-w-full min-w-0 items-center gap-2">
      <span className="sr-only sm:not-sr-only">Café</span>
      <select
        value={current}
        disabled={busy}
        onChange={(e) => void choose(Number(e.target.value))}
        data-testid="cafe-choice"
        className={cn(
          'min-h-11 w-44 rounded-lg border border-current px-2 font-semibold sm:w-auto sm:max-w-xs',
          dark ? 'bg-roast-850 text-crema-100' : 'bg-white text-ink-900',
        )}
      >
        {session.groupCafes.map((c) => (
          <option key={c.id} value={c.id}>
            {c.name}
          </option>
        ))}
      </select>
      {failed && (
        <span role="alert" className="font-semibold">
          {failed}
        </span>
      )}
    </label>
  );
}
