import { useEffect } from 'react';
import { Outlet, useMatches } from 'react-router';
import { useHydratedMark } from '@/lib/use-hydrated';

export interface RouteHandle {
  title?: string;
  /** Extra markup for the page head, rendered on the server (e.g. a no-script refresh). */
  head?: string;
  /**
   * The queries whose data the server-rendered page embeds for hydration (by key prefix); unset,
   * every query the loaders filled. A customer-facing screen lists only its own.
   */
  embed?: readonly (readonly string[])[];
}

/** The queries the matched screens let the page embed; null: all of them. */
export function embedOf(matches: { handle?: unknown }[]): (readonly string[])[] | null {
  const lists = matches.flatMap((m) => {
    const embed = (m.handle as RouteHandle | undefined)?.embed;
    return embed ? [embed] : [];
  });
  return lists.length ? lists.flat() : null;
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
  useHydratedMark();
  return <Outlet />;
}
