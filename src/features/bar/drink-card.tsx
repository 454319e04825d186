import { allergyClash } from '@/domain/allergens';
import { needsAllergyAck, hasAllergy, type LaneDrink } from '@/domain/lanes';
import { REMAKE_REASON_SHORT } from '@/domain/remakes';
import { ticketAgeSeconds } from '@/domain/tickets';
import { cn } from '@/lib/cn';
import { Button } from '@/components/ui/button';
import { ServiceMark } from '@/components/ui/service-mark';
import { cupSizeLabel, type VolumeUnit } from '@/domain/units';
import { PourLine, ageLabel } from './pour-line';

/** The usual caution on every allergy card; the café's own rules and the recipe decide. */
export const ALLERGY_CAUTION = 'Check the recipe and ingredients; clean wand, jug and cup; follow your local allergen rules.';

interface Props {
  card: LaneDrink;
  unit: VolumeUnit;
  nowMs: number;
  targetSeconds: number;
  /** 1–9: the number key that bumps this card. */
  keyNumber: number | null;
  /** "Jug 1 · pour 2nd": which jug this drink's milk comes from, and its place in the pour. */
  jugLabel: string | null;
  focused: boolean;
  busy: boolean;
  canRush: boolean;
  onStart(): void;
  onBump(): void;
  onAcknowledge(): void;
  onRush(): void;
}

const firstName = (name: string) => name.trim().split(/\s+/)[0] ?? name;

/** Who took the order and who is making the drink, so a question goes to the right person. */
function WhoLine({ takenBy, startedBy }: { takenBy?: string | null; startedBy?: string | null }) {
  const parts = [takenBy && `Taken by ${firstName(takenBy)}`, startedBy && `Making: ${firstName(startedBy)}`].filter(Boolean);
  if (parts.length === 0) return null;
  return (
    <p data-testid="who" className="mt-1 text-xl text-crema-100">
      {parts.join(' · ')}
    </p>
  );
}

export function DrinkCard({ card, unit, nowMs, targetSeconds, keyNumber, jugLabel, focused, busy, canRush, onStart, onBump, onAcknowledge, onRush }: Props) {
  const allergy = hasAllergy(card);
  const unread = needsAllergyAck(card);
  const age = ticketAgeSeconds(card.firedAt, nowMs);
  const late = age > targetSeconds;
  const size = card.sizeName ? `${card.sizeName}${card.volumeMl ? ` ${cupSizeLabel(card.volumeMl, unit)}` : ''}` : null;
  // the build, as the barista makes it: size, shots, then each extra (decaf, syrups…) on its own
  const build = [size, card.shots ? `${card.shots} shot${card.shots > 1 ? 's' : ''}` : 'No shots', ...card.extras].filter((b): b is string => !!b);
  const clash = allergyClash(card.contains, card.allergens);
  return (
    <article
      data-testid="drink-card"
      data-drink-id={card.id}
      data-ticket={card.ticketNumber}
      data-allergy={allergy || undefined}
      aria-label={`Ticket ${card.ticketNumber}, ${card.customerName}: ${card.itemName}${allergy ? ', allergy' : ''}`}
      data-focused={focused || undefined}
      className={cn(
        // a long name or note wraps inside the card (inherited), never cut: a cut name is a drink collected by the wrong person
        'rounded-xl border-2 bg-roast-750 p-2 text-crema-100 [overflow-wrap:anywhere]',
        card.status === 'making' ? 'border-crema-100' : 'border-transparent',
        late && 'border-dashed border-copper-300',
        // an allergy changes the whole card: a thick solid frame and a banner in words
        allergy && 'border-[6px] border-solid border-alert-ink',
        focused && 'outline-4 outline-offset-2 outline-copper-300',
      )}
    >
      {allergy && (
        <div data-testid="allergy" className="allergy-band -mx-2 -mt-2 mb-2 rounded-t-md px-2 py-2 text-roast-950">
          <p className="text-3xl leading-tight font-bold tracking-wide">⚠ ALLERGY</p>
          <p className="text-2xl leading-tight font-bold">{card.allergens.join(', ').toUpperCase()}</p>
          {card.allergyNote && <p className="text-xl font-semibold">{card.allergyNote}</p>}
          {clash.length > 0 && (
            <p data-testid="contains-clash" className="mt-1 rounded bg-roast-950 px-2 text-xl font-semibold text-alert-ink">
              THIS DRINK CONTAINS {clash.join(', ').toUpperCase()} — check with the counter
            </p>
          )}
          <p className="mt-1 text-lg font-semibold">{ALLERGY_CAUTION}</p>
          {unread ? (
            <Button tone="dark" size="lg" className="mt-2 w-full" disabled={busy} onClick={onAcknowledge}>
              I have read the allergy
            </Button>
          ) : (
            <p className="mt-1 text-lg font-semibold">Read by {card.allergyAckBy ?? 'the bar'}</p>
          )}
        </div>
      )}
      <header className="flex flex-wrap items-baseline gap-x-3">
        {keyNumber !== null && (
          <kbd
            title={`Press ${keyNumber} to bump`}
            className="grid size-10 shrink-0 place-items-center self-center rounded-md bg-crema-100 font-display text-3xl font-semibold text-roast-950"
          >
            {keyNumber}
          </kbd>
        )}
        <span className="font-display text-5xl leading-none font-semibold">#{card.ticketNumber}</span>
        <span className="min-w-0 text-3xl font-semibold">{card.customerName}</span>
        {card.ticketSize > 1 && (
          <span className="ml-auto shrink-0 rounded-md border-2 border-crema-100 px-2 text-xl font-semibold">
            {card.indexInTicket} of {card.ticketSize}
          </span>
        )}
      </header>
      <p className="mt-1 flex flex-wrap items-center gap-x-3 gap-y-1 text-2xl font-semibold">
        {card.rushedAt && <span className="rounded-md bg-crema-100 px-2 text-roast-950">RUSH</span>}
        <ServiceMark service={card.service} />
      </p>
      <p className="mt-1 text-3xl leading-tight font-bold break-words">{card.itemName}</p>
      <p data-testid="build" className="text-[1.75rem] leading-snug font-semibold break-words text-crema-100">
        {build.map((b, i) => (
          <span key={i} className="inline-block pr-2">
            {b}
            {i < build.length - 1 ? ' ·' : ''}
          </span>
        ))}
      </p>
      {jugLabel && (
        <p data-testid="jug-label" className="mt-1 text-2xl font-semibold underline decoration-2 underline-offset-4">
          {jugLabel}
        </p>
      )}
      {card.kidsTemp && (
        <p data-testid="kids-temp" className="mt-1 w-fit rounded-md border-2 border-dashed border-crema-100 px-2 text-2xl font-semibold">
          Kids' temperature: steam cooler, in its own jug
        </p>
      )}
      {card.remake && (
        <p data-testid="remake" className="mt-1 w-fit rounded-md border-2 border-crema-100 px-2 text-2xl font-semibold">
          <span className="font-bold tracking-wide uppercase">Remake</span> · {REMAKE_REASON_SHORT[card.remake.reason]}
          {card.remake.note ? `: ${card.remake.note}` : ''}
        </p>
      )}
      {card.note && <p className="mt-1 text-2xl font-semibold text-alert-ink">Note: {card.note}</p>}
      <WhoLine takenBy={card.takenBy} startedBy={card.status === 'making' ? card.startedBy : null} />
      <div className="mt-2 flex items-center gap-3">
        <PourLine ageSeconds={age} targetSeconds={targetSeconds} />
        <span data-testid="age" className={cn('shrink-0 font-display text-4xl font-semibold', late && 'underline decoration-4')}>
          {ageLabel(age, targetSeconds)}
        </span>
      </div>
      <div className="mt-2 flex flex-wrap gap-2">
        {card.status === 'queued' ? (
          // nowrap: a narrow lane puts Bump on a row of its own rather than split a word ("Star / t")
          <Button tone="dark" size="lg" className="flex-1 whitespace-nowrap" disabled={busy} onClick={onStart}>
            Start
          </Button>
        ) : (
          <span className="flex flex-1 items-center justify-center rounded-lg border-2 border-crema-300 text-xl font-semibold whitespace-nowrap">Making</span>
        )}
        <Button
          tone="bump"
          size="lg"
          className="flex-[2] whitespace-nowrap"
          disabled={busy || unread}
          title={unread ? 'Read the allergy first' : undefined}
          onClick={onBump}
        >
          Bump ✓
        </Button>
        {canRush && !card.rushedAt && (
          <Button tone="dark" size="lg" disabled={busy} onClick={onRush}>
            Rush
          </Button>
        )}
      </div>
    </article>
  );
}
