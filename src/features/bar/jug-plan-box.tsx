// A lane's jugs under its name: each started jug with "Bump jug N" (it bumps exactly the drinks
// shown, as started), then the next jug to steam with "Start jug N", then how many more follow.
// Started or not is said in words, not only by look.
import { describeJug, type Jug } from '../../domain/jug-plan';
import { needsAllergyAck, type PlannedLane } from '../../domain/lanes';
import { Button } from '../../components/ui/button';

interface Props {
  lane: PlannedLane;
  busy: boolean;
  onStartJug(drinkIds: number[]): void;
  onBumpJug(jugId: number, drinkIds: number[]): void;
}

export function JugPlanBox({ lane, busy, onStartJug, onBumpJug }: Props) {
  const started = lane.jugPlan.filter((j) => j.jugId !== null);
  const [next, ...later] = lane.jugPlan.filter((j) => j.jugId === null);
  if (!started.length && !next) return null;
  const unread = new Set(lane.groups.flatMap((g) => g.drinks).filter(needsAllergyAck).map((d) => d.id));
  const n = started.length + 1;
  return (
    <div data-testid="jug-plan" className="mt-2 flex flex-col gap-2 rounded-lg bg-roast-750 p-2">
      {started.map((jug, i) => {
        const held = jug.drinkIds.some((id) => unread.has(id));
        return (
          <JugRow key={jug.jugId} label={`Jug ${i + 1} · started`} jug={jug} state="started">
            <Button tone="bump" disabled={busy || held} title={held ? 'Read the allergy first' : undefined} onClick={() => onBumpJug(jug.jugId!, jug.drinkIds)}>
              Bump jug {i + 1}
            </Button>
          </JugRow>
        );
      })}
      {next && (
        <JugRow label={`Jug ${n}`} jug={next} state="planned">
          <Button tone="dark" disabled={busy} onClick={() => onStartJug(next.drinkIds)}>
            Start jug {n}
          </Button>
        </JugRow>
      )}
      {later[0] && (
        <p className="text-lg text-crema-300">
          Jug {n + 1}: {describeJug(later[0])}
          {later.length > 1 ? ` · then ${later.length - 1} more jug${later.length > 2 ? 's' : ''}` : ''}
        </p>
      )}
    </div>
  );
}

function JugRow({ label, jug, state, children }: { label: string; jug: Jug; state: 'started' | 'planned'; children: React.ReactNode }) {
  return (
    <div data-testid="jug" data-jug-state={state} className="flex items-center gap-3">
      <p className="flex-1 text-xl font-semibold">
        <span className={state === 'started' ? 'rounded-md bg-crema-100 px-2 text-roast-950' : 'text-crema-300'}>{label}:</span>{' '}
        {describeJug(jug)}
      </p>
      <div className="w-40 shrink-0 [&>button]:w-full">{children}</div>
    </div>
  );
}
