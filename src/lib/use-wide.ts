// Whether the screen is at least a tablet's width (Tailwind's `md`), for a layout that moves a
// panel rather than restyles it. The server renders the narrow layout's answer (false); a panel
// placed by this should be one that only appears after a tap, so hydration never differs. Where
// the browser can't say (no matchMedia), the narrow layout is the one that works everywhere.
import { useSyncExternalStore } from 'react';

const QUERY = '(min-width: 48rem)';
const media = () => (typeof window.matchMedia === 'function' ? window.matchMedia(QUERY) : null);

function subscribe(onChange: () => void) {
  const list = media();
  list?.addEventListener('change', onChange);
  return () => list?.removeEventListener('change', onChange);
}

export function useWide(): boolean {
  return useSyncExternalStore(
    subscribe,
    () => media()?.matches ?? false,
    () => false,
  );
}
