// Ticket timing rules shared by the server and the screens.

/** How long after a bump a barista may still recall it. */
export const RECALL_WINDOW_SECONDS = 5 * 60;
