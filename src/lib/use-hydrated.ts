import { useEffect, useState } from 'react';

/** False in the server's HTML and the first client render; true once React is running. */
export function useHydrated(): boolean {
  const [hydrated, setHydrated] = useState(false);
  useEffect(() => setHydrated(true), []);
  return hydrated;
}

/**
 * Marks `<html data-hydrated>` once React runs the screen (or its error page): the mark the e2e
 * checks wait on before pressing keys, opening dialogs or measuring widths.
 */
export function useHydratedMark(): void {
  useEffect(() => {
    document.documentElement.dataset.hydrated = 'true';
  }, []);
}
