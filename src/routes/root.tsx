import { useEffect } from 'react';
import { Outlet, useMatches } from 'react-router';

export interface RouteHandle {
  title?: string;
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
