// A lane's jugs under its name: each started jug with "Bump jug N" (it bumps exactly the drinks
// shown, as started), then the next jug to steam with "Start jug N", then how many more follow.
// Each jug names the cups it pours, in pour order (ticket number and first name, as on the cards).
// Started or not is said in words, not only by look. Volumes in the café's unit.
import { describeJug, type Jug } from '@/domain/jug-plan';
import { needsAllergyAck, type LaneDrink, type PlannedLane } from '@/domain/lanes';
import { plural } from '@/domain/plural';
import { firstName } from '@/domain/tickets';
import type { VolumeUnit } from '@/domain/units';
import { Button } from '@/components/ui/button';

interface Props {
  lane: PlannedLane;
  unit: VolumeUnit;
  busy: boolean;
  onStartJug(drinkIds: number[]): void;
  onBumpJug(jugId: number, drinkIds: number[]): void;
}

export function JugPlanBox({ lane, unit, busy, onStartJug, onBumpJug }: Props) {
  const started = lane.jugPlan.filter((j) => j.jugId !== null);
  const [next, ...later] = lane.jugPlan.filter((j) => j.jugId === null);
  if (!started.length && !next) return null;
  const byId = new Map(lane.drinks.map((d) => [d.id, d]));
  const unread = new Set(lane.drinks.filter(needsAllergyAck).map((d) => d.id));
  const n = started.length + 1;
  const laterDrinks = later.reduce((k, j) => k + j.drinkIds.length, 0);
  return (
    <div data-testid="jug-plan" className="mt-2 flex flex-col gap-2 rounded-lg bg-roast-750 p-2">
      {started.map((jug, i) => {
        const held = jug.drinkIds.some((id) => unread.has(id));
        return (
          <JugRow key={jug.jugId} label={`Jug ${i + 1} · started`} jug={jug} unit={unit} cups={byId} state="started">
            <Button
              tone="bump"
              size="lg"
              className="text-2xl"
              disabled={busy || held}
              title={held ? 'Read the allergy first' : undefined}
              onClick={() => onBumpJug(jug.jugId!, jug.drinkIds)}
            >
              Bump jug {i + 1}
            </Button>
          </JugRow>
        );
      })}
      {next && (
        <JugRow label={`Jug ${n}`} jug={next} unit={unit} cups={byId} state="planned">
          <Button tone="dark" size="lg" className="text-2xl" disabled={busy} onClick={() => onStartJug(next.drinkIds)}>
            Start jug {n}
          </Button>
        </JugRow>
      )}
      {later.length > 0 && (
        <p data-testid="later-jugs" className="text-xl text-crema-100">
          Then {plural(later.length, 'more jug', 'more jugs')} ({plural(laterDrinks, 'drink')})
        </p>
      )}
    </div>
  );
}

interface RowProps {
  label: string;
  jug: Jug;
  unit: VolumeUnit;
  cups: Map<number, LaneDrink>;
  state: 'started' | 'planned';
  children: React.ReactNode;
}

function JugRow({ label, jug, unit, cups, state, children }: RowProps) {
  const pours = jug.drinkIds.map((id) => cups.get(id)).filter((d): d is LaneDrink => !!d);
  return (
    <div data-testid="jug" data-jug-state={state} className="flex flex-col gap-2">
      <p className="text-xl font-semibold">
        <span className={state === 'started' ? 'rounded-md bg-crema-100 px-2 text-roast-950' : 'text-crema-100 underline decoration-2 underline-offset-4'}>
          {label}:
        </span>{' '}
        {describeJug(jug, unit)}
      </p>
      <p data-testid="jug-cups" className="text-xl">
        Pour:{' '}
        {pours.map((d, i) => (
          <span key={d.id} className="mr-2 inline-block">
            {i + 1}. <strong>#{d.ticketNumber}</strong> {firstName(d.customerName)}
          </span>
        ))}
      </p>
      <div className="[&>button]:w-full">{children}</div>
    </div>
  );
}
