// The Bar's "Espresso on the grinder" strip: what is in each grinder and its last good dial-in
// settings, readable from two metres (24 px and up on the dark theme). It never holds up the Bar:
// it loads beside it, and a failure only hides the strip.
import { useQuery, useQueryClient } from '@tanstack/react-query';
import { useEffect } from 'react';
import { HOPPER_LABEL } from '@/domain/bean-stock';
import { FRESHNESS_LABEL } from '@/domain/freshness';
import { useApi } from '@/lib/api-context';
import { dialInKeys, dialInQuery } from '@/queries/dial-in';
import { shotNumbers } from './shot-view';

/** Refetch when the bar's live log moves (a bump uses coffee, a lot changes grinder, a dial-in shot is logged: beans.changed), and every minute besides. */
export function EspressoStrip({ seq }: { seq: number }) {
  const api = useApi();
  const qc = useQueryClient();
  const { data } = useQuery({ ...dialInQuery(api), refetchInterval: 60_000 });
  useEffect(() => {
    const t = setTimeout(() => qc.invalidateQueries({ queryKey: dialInKeys.view() }), 1_000);
    return () => clearTimeout(t);
  }, [seq, qc]);
  if (!data) return null;
  const inGrinders = data.lots.filter((l) => l.hopper !== 'shelf').sort((a, b) => (a.hopper === 'espresso' ? -1 : b.hopper === 'espresso' ? 1 : 0));

  return (
    <section
      aria-label="Espresso on the grinder"
      data-testid="espresso-strip"
      className="flex flex-wrap items-center gap-x-8 gap-y-1 border-y border-crema-300/30 bg-roast-850 px-5 py-2 text-2xl"
    >
      <h2 className="text-2xl font-semibold text-crema-300">Espresso on the grinder</h2>
      {!inGrinders.some((l) => l.hopper === 'espresso') && <p>No lot in the espresso grinder — set one in Beans</p>}
      {inGrinders.map((l) => (
        <p key={l.id} data-testid={`grinder-${l.hopper}`}>
          {l.hopper !== 'espresso' && <span className="text-crema-300">{HOPPER_LABEL[l.hopper]}: </span>}
          <strong>{l.name}</strong>
          <span className="text-crema-300">
            {' '}
            · day {l.daysSinceRoast} {FRESHNESS_LABEL[l.freshness].toLowerCase()}
            {l.stock !== 'ok' && <> · {l.stock === 'low' ? '▼ low' : '✕ empty'}</>}
          </span>
          {l.lastGood ? (
            <span data-testid="last-good">
              {' '}
              · grind <strong className="font-display text-3xl">{l.lastGood.grind}</strong> · {shotNumbers(l.lastGood)}
            </span>
          ) : (
            <span className="text-crema-300"> · no good shot yet: dial in</span>
          )}
        </p>
      ))}
    </section>
  );
}
