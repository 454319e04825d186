// Screens show ages by the server's clock: a bar tablet whose own clock drifts must not
// make tickets look older or younger than they are.
let offsetMs = 0;

/** Call with the server's `now` when a snapshot or event arrives. */
export function syncServerClock(serverNowIso: string, receivedAtMs = Date.now()) {
  const serverMs = Date.parse(serverNowIso);
  if (!Number.isNaN(serverMs)) offsetMs = serverMs - receivedAtMs;
}

export const serverNow = () => Date.now() + offsetMs;
