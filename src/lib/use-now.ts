import { useEffect, useState } from 'react';
import { serverNow } from './server-clock';

/**
 * The current time by the server's clock, re-read every `everyMs`. The first render uses
 * `initialMs` (the time the server rendered with) so hydration matches the server's HTML.
 */
export function useNow(initialMs: number, everyMs = 1000): number {
  const [now, setNow] = useState(initialMs);
  useEffect(() => {
    setNow(serverNow());
    const timer = setInterval(() => setNow(serverNow()), everyMs);
    return () => clearInterval(timer);
  }, [everyMs]);
  return now;
}
