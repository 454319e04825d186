// The staff menu's "Switch person" control. The dialog (PIN pad, the own-PIN form with its form
// and schema libraries) loads on the first tap, so it weighs nothing on the Bar and the Counter.
import { lazy, Suspense, useState } from 'react';
import { confirmLeave } from '@/lib/leave-guard';

const SwitchDialog = lazy(() => import('./switch-person').then((m) => ({ default: m.SwitchDialog })));

export function SwitchPersonButton({ className }: { className?: string }) {
  const [open, setOpen] = useState(false);
  return (
    <>
      <button type="button" onClick={() => confirmLeave() && setOpen(true)} className={className}>
        Switch person
      </button>
      {open && (
        <Suspense fallback={null}>
          <SwitchDialog onClose={() => setOpen(false)} />
        </Suspense>
      )}
    </>
  );
}
