import { useEffect } from 'react';
import { Outlet, useMatches } from 'react-router';

export interface RouteHandle {
  title?: string;
  /** Extra markup for the page head, rendered on the server (e.g. a no-script refresh). */
  head?: string;
}

export function headOf(matches: { handle?: unknown }[]): string {
  return matches.map((m) => (m.handle as RouteHandle | undefined)?.head ?? '').join('');
}

export function titleOf(matches: { handle?: unknown }[]): string {
  const title = [...matches].reverse().find((m) => (m.handle as RouteHandle | undefined)?.title);
  return title ? `${(title.handle as RouteHandle).title} · Jugline` : 'Jugline';
}

export function Root() {
  const matches = useMatches();
  const title = titleOf(matches);
  useEffect(() => {
    document.title = title;
  }, [title]);
  return <Outlet />;
}
