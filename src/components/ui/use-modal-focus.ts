// Focus for a modal made of plain elements (a sheet, a drawer, a confirmation): it takes the
// focus when it opens, Tab and Shift+Tab cycle inside it, and the focus goes back to whatever
// opened it when it closes — so a keyboard never wanders onto the page behind the backdrop.
// Stacked modals (a confirmation over a sheet): only the top one handles Tab.
import { useEffect, useRef, useState, type RefObject } from 'react';

const FOCUSABLE = [
  'a[href]',
  'button:not([disabled])',
  'input:not([disabled]):not([type="hidden"])',
  'select:not([disabled])',
  'textarea:not([disabled])',
  '[tabindex]:not([tabindex="-1"])',
].join(',');

/** The elements Tab reaches inside `box`, in order (rendered ones only). */
export function focusables(box: HTMLElement): HTMLElement[] {
  return [...box.querySelectorAll<HTMLElement>(FOCUSABLE)].filter((el) => el.tabIndex >= 0 && el.getClientRects().length > 0);
}

const open: HTMLElement[] = [];

/**
 * The opener itself, or — when its list re-rendered it as a new node while the modal was open
 * (a table's cells, say) — the element that now stands in its place, found by id or name.
 */
function standIn(opener: HTMLElement | null): HTMLElement | null {
  if (!opener || opener.isConnected) return opener;
  const tag = opener.tagName.toLowerCase();
  const label = opener.getAttribute('aria-label');
  const selector = opener.id ? `#${CSS.escape(opener.id)}` : label ? `${tag}[aria-label="${CSS.escape(label)}"]` : null;
  return selector ? document.querySelector<HTMLElement>(selector) : null;
}

/**
 * `initial` picks the element to focus on open (the safe choice of a confirmation, the first
 * field of a form); unset or null, the first focusable element.
 */
export function useModalFocus(ref: RefObject<HTMLElement | null>, initial?: (box: HTMLElement) => HTMLElement | null | undefined) {
  const pick = useRef(initial);
  pick.current = initial;
  // taken at the first render, before any child's effect moves the focus into the modal
  const [opener] = useState(() => (typeof document !== 'undefined' && document.activeElement instanceof HTMLElement ? document.activeElement : null));
  useEffect(() => {
    const box = ref.current;
    if (!box) return;
    open.push(box);
    (pick.current?.(box) ?? focusables(box)[0] ?? box).focus();

    const onKey = (e: KeyboardEvent) => {
      if (e.key !== 'Tab' || open[open.length - 1] !== box) return;
      const items = focusables(box);
      const first = items[0];
      const last = items[items.length - 1];
      const active = document.activeElement;
      if (!first || !last) return e.preventDefault();
      const outside = !box.contains(active);
      if (e.shiftKey && (active === first || outside)) {
        e.preventDefault();
        last.focus();
      } else if (!e.shiftKey && (active === last || outside)) {
        e.preventDefault();
        first.focus();
      }
    };
    // capture: a modal that stops its keys from reaching the page (switch person) still gets Tab here
    document.addEventListener('keydown', onKey, true);
    return () => {
      document.removeEventListener('keydown', onKey, true);
      open.splice(open.indexOf(box), 1);
      // back to the opener, unless the focus has already gone somewhere on purpose
      const lost = !document.activeElement || document.activeElement === document.body || box.contains(document.activeElement);
      if (lost) standIn(opener)?.focus();
    };
  }, [ref, opener]);
}
