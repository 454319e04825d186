import { useEffect, useState } from 'react';

/** False in the server's HTML and the first client render; true once React is running. */
export function useHydrated(): boolean {
  const [hydrated, setHydrated] = useState(false);
  useEffect(() => setHydrated(true), []);
  return hydrated;
}
