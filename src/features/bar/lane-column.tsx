import type { Lane } from '../../domain/lanes';

/** Cold milk the lane's hot drinks need in total; the jug plan will split it into pitchers. */
export function laneColdMilkMl(lane: Lane): number {
  return lane.groups
    .flatMap((g) => g.drinks)
    .filter((d) => d.texture !== 'cold')
    .reduce((sum, d) => sum + d.milkMl, 0);
}

export function laneShots(lane: Lane): number {
  return lane.groups.flatMap((g) => g.drinks).reduce((sum, d) => sum + d.shots, 0);
}

export function LaneColumn({ lane, children }: { lane: Lane; children: (group: Lane['groups'][number]) => React.ReactNode }) {
  const milkMl = laneColdMilkMl(lane);
  const shots = laneShots(lane);
  return (
    <section
      data-testid="lane"
      data-lane={lane.milk?.name ?? 'No milk'}
      aria-label={`${lane.milk?.name ?? 'No milk'} lane`}
      className="flex w-[27rem] shrink-0 flex-col rounded-2xl bg-roast-850 p-3"
    >
      <header className="flex items-center gap-3 border-b border-crema-300/30 pb-2">
        <span className="grid size-12 place-items-center rounded-lg border-2 border-crema-100 font-display text-2xl font-semibold">
          {lane.milk?.code ?? '—'}
        </span>
        <h2 className="font-display text-4xl font-semibold uppercase tracking-wide">{lane.milk?.name ?? 'No milk'}</h2>
        <span className="ml-auto text-right text-lg leading-tight text-crema-300">
          {lane.drinkCount} drink{lane.drinkCount === 1 ? '' : 's'}
          <br />
          {shots} shot{shots === 1 ? '' : 's'}
          {milkMl > 0 ? ` · ${milkMl} ml milk` : ''}
        </span>
      </header>
      <div className="mt-2 flex flex-col gap-3 overflow-y-auto">
        {lane.groups.map((group) => (
          <div key={group.shots} data-testid="shot-group" data-shots={group.shots}>
            <h3 className="mb-2 text-lg font-semibold uppercase tracking-widest text-crema-300">
              {group.shots === 0 ? 'No shots' : `${group.shots} shot${group.shots > 1 ? 's' : ''}`}
            </h3>
            <div className="flex flex-col gap-3">{children(group)}</div>
          </div>
        ))}
      </div>
    </section>
  );
}
