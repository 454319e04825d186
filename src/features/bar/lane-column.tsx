import { useRef } from 'react';
import type { PlannedLane } from '../../domain/lanes';
import { JugPlanBox } from './jug-plan-box';
import { useHiddenBelow } from './use-hidden-below';

export const grams = (dg: number) => `${(dg / 10).toFixed(dg % 10 === 0 ? 0 : 1)} g`;

interface Props {
  lane: PlannedLane;
  /** Narrower lanes when there are many, so five milks fit a 1920 px screen. */
  narrow?: boolean;
  busy: boolean;
  onStartJug(drinkIds: number[]): void;
  onBumpJug(jugId: number, drinkIds: number[]): void;
  children: (group: PlannedLane['groups'][number]) => React.ReactNode;
}

/** A milk lane: its name and badge, its jug plan and shot plan, then its drinks by shot count. */
export function LaneColumn({ lane, narrow, busy, onStartJug, onBumpJug, children }: Props) {
  const name = lane.milk?.name ?? 'No milk';
  const scroller = useRef<HTMLDivElement>(null);
  const hidden = useHiddenBelow(scroller, lane.groups.flatMap((g) => g.drinks.map((d) => d.id)).join(','));
  return (
    <section
      data-testid="lane"
      data-lane={name}
      aria-label={`${name} lane`}
      // Lanes share the screen's width by how many drinks they hold, so a busy lane lays its cards
      // side by side instead of hiding them below the fold while the screen stands half empty.
      style={{ flexGrow: lane.drinkCount }}
      className={`flex ${narrow ? 'min-w-[22.5rem]' : 'min-w-[27rem]'} shrink-0 basis-0 flex-col rounded-2xl bg-roast-850 p-3`}
    >
      <header className="border-b border-crema-300/30 pb-2">
        <div className="flex items-center gap-3">
          <span className="grid size-12 place-items-center rounded-lg border-2 border-crema-100 font-display text-2xl font-semibold">
            {lane.milk?.code ?? '—'}
          </span>
          <h2 className="font-display text-4xl font-semibold tracking-wide uppercase">{name}</h2>
          <span data-testid="shot-plan" className="ml-auto text-right text-lg leading-tight text-crema-300">
            {lane.drinkCount} drink{lane.drinkCount === 1 ? '' : 's'}
            <br />
            {lane.shotPlan.shots} shot{lane.shotPlan.shots === 1 ? '' : 's'} · {grams(lane.shotPlan.doseDg)}
          </span>
        </div>
        <JugPlanBox lane={lane} busy={busy} onStartJug={onStartJug} onBumpJug={onBumpJug} />
      </header>
      <div ref={scroller} className="mt-2 flex flex-col gap-3 overflow-y-auto">
        {lane.groups.map((group) => (
          <div key={group.shots} data-testid="shot-group" data-shots={group.shots}>
            <h3 className="mb-2 text-lg font-semibold tracking-widest text-crema-300 uppercase">
              {group.shots === 0 ? 'No shots' : `${group.shots} shot${group.shots > 1 ? 's' : ''}`}
            </h3>
            <div className="grid grid-cols-[repeat(auto-fill,minmax(21rem,1fr))] gap-3">{children(group)}</div>
          </div>
        ))}
      </div>
      {hidden > 0 && (
        <p data-testid="more-below" className="mt-2 rounded-lg border-2 border-crema-300 py-1 text-center text-xl font-semibold">
          ↓ {hidden} more below
        </p>
      )}
    </section>
  );
}
