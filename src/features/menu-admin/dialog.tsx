// A modal sheet for the editor's forms: from the right on a wide screen, full width on a tablet.
// Esc or the backdrop closes it; the page behind stays put. The focus stays inside while it is
// open and goes back to the opener when it closes (useModalFocus).
import { useEffect, useId, useRef, type ReactNode } from 'react';
import { Button } from '@/components/ui/button';
import { useModalFocus } from '@/components/ui/use-modal-focus';
import { cn } from '@/lib/cn';

/**
 * Esc calls the latest `close` (parents pass a new function each render). A confirmation on top
 * of a sheet takes Esc first (capture) and keeps it from closing the sheet too.
 */
function useEscape(close: () => void, onTop = false) {
  const latest = useRef(close);
  latest.current = close;
  useEffect(() => {
    const onKey = (e: KeyboardEvent) => {
      if (e.key !== 'Escape') return;
      if (!onTop && document.querySelector('[role="alertdialog"]')) return;
      if (onTop) e.stopPropagation();
      latest.current();
    };
    window.addEventListener('keydown', onKey, onTop);
    return () => window.removeEventListener('keydown', onKey, onTop);
  }, [onTop]);
}

interface Props {
  title: string;
  onClose(): void;
  children: ReactNode;
  /** The sticky bottom row: save, cancel… */
  footer: ReactNode;
  wide?: boolean;
}

export function Sheet({ title, onClose, children, footer, wide }: Props) {
  const titleId = useId();
  const panel = useRef<HTMLDivElement>(null);
  useEscape(onClose);
  // the first field takes the focus once, so typing can start at once
  useModalFocus(panel, (box) => box.querySelector<HTMLElement>('input, select, textarea'));
  return (
    <div className="fixed inset-0 z-30 flex justify-end bg-ink-900/40">
      <button type="button" aria-label="Close" tabIndex={-1} className="flex-1 cursor-default" onClick={onClose} />
      <div
        role="dialog"
        aria-modal="true"
        aria-labelledby={titleId}
        ref={panel}
        className={cn('flex h-full w-full flex-col bg-steam-50 shadow-2xl', wide ? 'max-w-[62rem]' : 'max-w-[40rem]')}
      >
        <div className="flex items-center gap-4 border-b border-steam-200 px-6 py-4">
          <h2 id={titleId} className="text-2xl font-semibold">
            {title}
          </h2>
          <Button tone="quiet" className="ml-auto" onClick={onClose}>
            Cancel
          </Button>
        </div>
        <div className="flex-1 overflow-y-auto px-6 py-5">{children}</div>
        <div className="border-t border-steam-200 bg-white px-6 py-3">{footer}</div>
      </div>
    </div>
  );
}

/** "Retire Latte?": what it means, then the owner's choice. Nothing happens without the second tap. */
export function ConfirmRetire({
  what,
  consequence,
  busy,
  onConfirm,
  onCancel,
}: {
  what: string;
  consequence: string;
  busy: boolean;
  onConfirm(): void;
  onCancel(): void;
}) {
  const titleId = useId();
  const box = useRef<HTMLDivElement>(null);
  useEscape(onCancel, true);
  useModalFocus(box, (el) => el.querySelector<HTMLElement>('[data-keep]')); // the safe choice has the focus
  return (
    <div className="fixed inset-0 z-40 grid place-items-center bg-ink-900/50 p-4">
      <div
        ref={box}
        role="alertdialog"
        aria-modal="true"
        aria-labelledby={titleId}
        className="w-full max-w-xl rounded-2xl border-2 border-ink-900 bg-white p-6 shadow-2xl"
      >
        <h2 id={titleId} className="text-2xl font-semibold">
          Retire {what}?
        </h2>
        <p className="mt-3 text-lg">{consequence}</p>
        <p className="mt-2 text-lg">Past orders keep it as it was sold. You can restore it later.</p>
        <div className="mt-6 flex justify-end gap-3">
          <Button data-keep tone="quiet" size="lg" onClick={onCancel}>
            Keep it
          </Button>
          <Button size="lg" disabled={busy} onClick={onConfirm}>
            Retire {what}
          </Button>
        </div>
      </div>
    </div>
  );
}
