import type { PlannedLane } from '@/domain/lanes';
import type { VolumeUnit } from '@/domain/units';
import { JugPlanBox } from './jug-plan-box';
import { MilkShape } from './milk-mark';

export const grams = (dg: number) => `${(dg / 10).toFixed(dg % 10 === 0 ? 0 : 1)} g`;
export const laneName = (lane: PlannedLane) => lane.milk?.name ?? 'No milk';

interface Props {
  lane: PlannedLane;
  unit: VolumeUnit;
  /** Cards of this lane below its edge (measured on screen). */
  hiddenBelow: number;
  busy: boolean;
  onStartJug(drinkIds: number[]): void;
  onBumpJug(jugId: number, drinkIds: number[]): void;
  children: React.ReactNode;
}

/**
 * A milk lane: its name and shape, its jug plan and shot plan, then its drinks oldest first. From
 * 768 px up the lanes stand side by side and share the width by how many drinks each holds (a
 * busy lane lays its cards side by side); below that they stack and the page scrolls down.
 */
export function LaneColumn({ lane, unit, hiddenBelow, busy, onStartJug, onBumpJug, children }: Props) {
  const name = laneName(lane);
  return (
    <section
      data-testid="lane"
      data-lane={name}
      data-lane-key={lane.key}
      aria-label={`${name} lane`}
      style={{ flexGrow: lane.drinkCount }}
      className="flex w-full shrink-0 flex-col rounded-2xl bg-roast-850 p-2 md:w-auto md:min-w-[13.5rem] md:basis-0"
    >
      <header className="border-b border-crema-300/30 pb-2">
        <div className="flex flex-wrap items-center gap-x-3 gap-y-1">
          <MilkShape milk={lane.milk} />
          <h2 className="font-display text-4xl font-semibold tracking-wide uppercase">{name}</h2>
          <span data-testid="shot-plan" className="ml-auto text-right text-xl leading-tight text-crema-100">
            {lane.drinkCount} drink{lane.drinkCount === 1 ? '' : 's'}
            <br />
            {lane.shotPlan.shots} shot{lane.shotPlan.shots === 1 ? '' : 's'} · {grams(lane.shotPlan.doseDg)}
          </span>
        </div>
        <JugPlanBox lane={lane} unit={unit} busy={busy} onStartJug={onStartJug} onBumpJug={onBumpJug} />
      </header>
      <div
        data-testid="lane-cards"
        className="mt-2 grid min-h-0 flex-1 auto-rows-max grid-cols-[repeat(auto-fill,minmax(min(100%,20rem),1fr))] content-start gap-2 md:overflow-y-auto"
      >
        {children}
      </div>
      {hiddenBelow > 0 && (
        <p data-testid="more-below" className="mt-2 rounded-lg border-2 border-crema-300 py-1 text-center text-xl font-semibold">
          ↓ {hiddenBelow} more below
        </p>
      )}
    </section>
  );
}
