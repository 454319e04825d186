import { allergyClash } from '../../domain/allergens';
import { needsAllergyAck, hasAllergy, type DrinkCard as Card } from '../../domain/lanes';
import { ticketAgeSeconds } from '../../domain/tickets';
import { cn } from '../../lib/cn';
import { Button } from '../../components/ui/button';
import { PourLine, ageLabel } from './pour-line';

interface Props {
  card: Card;
  nowMs: number;
  targetSeconds: number;
  /** 1–9: the number key that bumps this card. */
  keyNumber: number | null;
  /** "Jug 1 · pour 2": where this drink sits in its lane's jug plan. */
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
    <p data-testid="who" className="mt-1 text-base text-crema-300">
      {parts.join(' · ')}
    </p>
  );
}

export function DrinkCard({ card, nowMs, targetSeconds, keyNumber, jugLabel, focused, busy, canRush, onStart, onBump, onAcknowledge, onRush }: Props) {
  const allergy = hasAllergy(card);
  const unread = needsAllergyAck(card);
  const age = ticketAgeSeconds(card.firedAt, nowMs);
  const late = age > targetSeconds;
  const size = card.sizeName ? `${card.sizeName}${card.volumeMl ? ` ${card.volumeMl} ml` : ''}` : null;
  return (
    <article
      data-testid="drink-card"
      data-drink-id={card.id}
      data-ticket={card.ticketNumber}
      aria-label={`Ticket ${card.ticketNumber}, ${card.customerName}: ${card.itemName}`}
      data-focused={focused || undefined}
      className={cn(
        'rounded-xl border-2 bg-roast-750 p-3 text-crema-100',
        card.status === 'making' ? 'border-crema-100' : 'border-transparent',
        late && 'border-dashed border-copper-300',
        focused && 'outline-4 outline-offset-2 outline-copper-300',
      )}
    >
      {(card.rushedAt || jugLabel) && (
        <p className="mb-1 flex gap-2 text-lg font-semibold">
          {card.rushedAt && <span className="rounded-md bg-crema-100 px-2 text-roast-950">RUSH</span>}
          {jugLabel && <span className="text-crema-300">{jugLabel}</span>}
        </p>
      )}
      <header className="flex items-baseline gap-3">
        {keyNumber !== null && (
          <kbd
            title={`Press ${keyNumber} to bump`}
            className="grid size-9 shrink-0 place-items-center rounded-md bg-crema-100 font-display text-2xl font-semibold text-roast-950"
          >
            {keyNumber}
          </kbd>
        )}
        <span className="font-display text-5xl leading-none font-semibold">#{card.ticketNumber}</span>
        <span className="truncate text-3xl font-semibold">{card.customerName}</span>
        {card.ticketSize > 1 && (
          <span className="ml-auto shrink-0 rounded-md border border-crema-300 px-2 text-lg font-semibold text-crema-300">
            {card.indexInTicket} of {card.ticketSize}
          </span>
        )}
      </header>
      <p className="mt-2 text-3xl leading-tight font-semibold">{card.itemName}</p>
      <p className="text-xl text-crema-300">
        {[size, card.shots ? `${card.shots} shot${card.shots > 1 ? 's' : ''}` : null, ...card.modifiers]
          .filter(Boolean)
          .join(' · ')}
      </p>
      {card.note && <p className="mt-1 text-xl font-semibold text-alert-ink">Note: {card.note}</p>}
      <WhoLine takenBy={card.takenBy} startedBy={card.status === 'making' ? card.startedBy : null} />
      {allergy && (
        <div data-testid="allergy" className="mt-2 rounded-lg border-2 border-alert-ink p-2 text-alert-ink">
          <p className="text-xl font-semibold">
            ⚠ ALLERGY: {[...card.allergens, card.allergyNote].filter(Boolean).join(' · ')}
          </p>
          {allergyClash(card.contains, card.allergens).length > 0 && (
            <p data-testid="contains-clash" className="mt-1 rounded bg-alert-ink px-2 text-xl font-semibold text-roast-950">
              THIS DRINK CONTAINS {allergyClash(card.contains, card.allergens).join(', ').toUpperCase()} — check with the counter
            </p>
          )}
          {unread ? (
            <Button tone="dark" size="lg" className="mt-2 w-full border-alert-ink text-alert-ink" disabled={busy} onClick={onAcknowledge}>
              I have read the allergy
            </Button>
          ) : (
            <p className="text-base">Read by {card.allergyAckBy ?? 'the bar'} — clean wand, jug and cup</p>
          )}
        </div>
      )}
      <div className="mt-3 flex items-center gap-3">
        <PourLine ageSeconds={age} targetSeconds={targetSeconds} />
        <span data-testid="age" className={cn('shrink-0 font-display text-4xl font-semibold', late && 'underline decoration-4')}>
          {ageLabel(age, targetSeconds)}
        </span>
      </div>
      <div className="mt-3 flex gap-3">
        {card.status === 'queued' ? (
          <Button tone="dark" size="lg" className="flex-1" disabled={busy} onClick={onStart}>
            Start
          </Button>
        ) : (
          <span className="flex flex-1 items-center justify-center rounded-lg border-2 border-crema-300 text-xl font-semibold">
            Making
          </span>
        )}
        <Button
          tone="bump"
          size="lg"
          className="flex-[2]"
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
