// Where a terminal goes after a PIN switch: it stays on the screen if the new person's role may
// see it, else it goes to their home screen.
import { can, HOME_SCREEN, type Role } from '@/domain/roles';
import { SCREENS } from '@/domain/screens';

function matches(pattern: string, pathname: string): boolean {
  const a = pattern.split('/');
  const b = pathname.replace(/\/+$/, '').split('/');
  return a.length === b.length && a.every((part, i) => (part.startsWith(':') ? b[i] !== '' : part === b[i]));
}

/** `here` is the path and query string the terminal shows now. */
export function screenAfterSwitch(here: string, role: Role): string {
  const pathname = here.split(/[?#]/)[0] || '/';
  const screen = Object.values(SCREENS).find((s) => matches(s.path, pathname));
  return screen && can(role, screen.need) ? here : HOME_SCREEN[role];
}
