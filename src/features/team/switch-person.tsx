// "Switch person" on a shared terminal: pick your name, type your PIN, and the terminal is yours
// (a new session; the screen stays if your role may see it, else your home screen).
import { useQuery } from '@tanstack/react-query';
import { useEffect, useRef, useState } from 'react';
import type { SwitchPerson } from '@/domain/team-schemas';
import { Button } from '@/components/ui/button';
import { useModalFocus } from '@/components/ui/use-modal-focus';
import { useApi } from '@/lib/api-context';
import { send } from '@/lib/commands';
import { ApiError, holdReads, leavePage } from '@/lib/http';
import { MyPinForm } from './my-pin-form';
import { PinPad } from './pin-pad';
import { switchPeopleQuery } from '@/queries/team';
import { screenAfterSwitch } from './switch-target';

export function SwitchDialog({ onClose }: { onClose(): void }) {
  const api = useApi();
  const people = useQuery(switchPeopleQuery(api));
  const [who, setWho] = useState<SwitchPerson | null>(null);
  const [mine, setMine] = useState(false);
  const [saved, setSaved] = useState<string | null>(null);
  const [pin, setPin] = useState('');
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const ref = useRef<HTMLDialogElement>(null);

  useEffect(() => {
    const dialog = ref.current;
    if (dialog && !dialog.open) dialog.showModal();
    return () => dialog?.close();
  }, []);
  // a modal <dialog> lets Tab out to the browser's own controls; this keeps it inside and hands
  // the focus back to "Switch person" on close
  useModalFocus(ref);

  const choose = (p: SwitchPerson | null) => {
    setWho(p);
    setPin('');
    setError(null);
  };

  const submit = async () => {
    if (!who || busy) return;
    if (pin.length < 4) return setError('Type all the digits of your PIN');
    setBusy(true);
    holdReads(true);
    try {
      const { user } = await send.switchPerson({ userId: who.id, pin });
      // a fresh page: the new session's data, and the live socket reconnects as the new person
      leavePage(screenAfterSwitch(window.location.pathname + window.location.search, user.role));
    } catch (err) {
      holdReads(false);
      setPin('');
      setError(err instanceof ApiError ? err.message : 'Could not switch');
      setBusy(false);
    }
  };

  return (
    <dialog
      ref={ref}
      aria-labelledby="switch-title"
      // keys typed here are for the dialog, not the bar's bump keys or the counter's tiles
      onKeyDown={(e) => e.stopPropagation()}
      onCancel={(e) => {
        e.preventDefault();
        if (who) choose(null);
        else if (mine) setMine(false);
        else onClose();
      }}
      className="m-auto w-[min(34rem,94vw)] rounded-2xl bg-steam-50 p-6 text-ink-900 shadow-2xl backdrop:bg-roast-950/80"
    >
      <h2 id="switch-title" className="text-2xl font-semibold">
        {who ? `PIN for ${who.name}` : mine ? 'Set my PIN' : 'Switch person'}
      </h2>
      {mine ? (
        <MyPinForm
          onCancel={() => setMine(false)}
          onDone={(message) => {
            setSaved(message);
            setMine(false);
          }}
        />
      ) : !who ? (
        <>
          <p className="mt-1 text-lg text-ink-600">Who is taking over this terminal?</p>
          {people.isPending ? (
            <p className="mt-4 text-lg">Loading…</p>
          ) : people.isError ? (
            <p role="alert" className="mt-4 text-lg font-semibold text-copper-700">
              Could not load the staff list.
            </p>
          ) : people.data.people.length === 0 ? (
            <p className="mt-4 text-lg">Nobody else has a PIN yet. The owner sets PINs on the Team screen.</p>
          ) : (
            <ul className="mt-4 grid grid-cols-2 gap-3">
              {people.data.people.map((p) => (
                <li key={p.id}>
                  <button
                    type="button"
                    onClick={() => choose(p)}
                    className="flex min-h-16 w-full flex-col items-start justify-center rounded-xl border border-steam-200 bg-white px-4 py-2 text-left hover:bg-steam-100"
                  >
                    <span className="text-xl font-semibold">{p.name}</span>
                    <span className="text-base text-ink-600 capitalize">{p.role}</span>
                  </button>
                </li>
              ))}
            </ul>
          )}
          {saved && (
            <p role="status" className="mt-4 text-lg font-semibold">
              ✓ {saved}
            </p>
          )}
          <div className="mt-6 flex justify-between gap-3">
            <Button tone="quiet" onClick={() => setMine(true)}>
              Set my PIN
            </Button>
            <Button tone="quiet" onClick={onClose}>
              Cancel
            </Button>
          </div>
        </>
      ) : (
        <form
          className="mt-4"
          onSubmit={(e) => {
            e.preventDefault();
            void submit();
          }}
        >
          <PinPad value={pin} onChange={setPin} onSubmit={() => void submit()} disabled={busy} label={`PIN for ${who.name}`} describedBy="switch-error" />
          <p id="switch-error" role="alert" className="mt-3 min-h-7 text-center text-lg font-semibold text-copper-700">
            {error}
          </p>
          <div className="mt-4 flex justify-between gap-3">
            <Button tone="quiet" onClick={() => choose(null)} disabled={busy}>
              ← Someone else
            </Button>
            <Button type="submit" size="lg" disabled={busy || pin.length < 4}>
              {busy ? 'Switching…' : 'Switch'}
            </Button>
          </div>
        </form>
      )}
    </dialog>
  );
}
