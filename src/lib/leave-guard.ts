// Work a screen would lose if the person left now (a half-built order on the Counter). The staff
// menu asks before signing out, switching person or opening another screen while it is there.
import { useEffect } from 'react';

let current: string | null = null;

/** While `message` is set, leaving through the staff menu asks first. */
export function useLeaveGuard(message: string | null) {
  useEffect(() => {
    current = message;
    return () => {
      if (current === message) current = null;
    };
  }, [message]);
}

/** true when nothing would be lost, or the person says to go anyway. */
export function confirmLeave(): boolean {
  return current === null || window.confirm(`${current} Leave anyway?`);
}
