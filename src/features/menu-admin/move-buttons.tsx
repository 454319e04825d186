import { Button } from '@/components/ui/button';

/** ↑ / ↓ (or ← / → for tabs) with the row's name in the label. */
export function MoveButtons({
  name,
  first,
  last,
  busy,
  onMove,
  across = false,
}: {
  name: string;
  first: boolean;
  last: boolean;
  busy: boolean;
  onMove(direction: 'up' | 'down'): void;
  across?: boolean;
}) {
  return (
    <span className="inline-flex gap-1">
      <Button tone="quiet" className="w-11 px-0" aria-label={`Move ${name} ${across ? 'left' : 'up'}`} disabled={busy || first} onClick={() => onMove('up')}>
        {across ? '←' : '↑'}
      </Button>
      <Button
        tone="quiet"
        className="w-11 px-0"
        aria-label={`Move ${name} ${across ? 'right' : 'down'}`}
        disabled={busy || last}
        onClick={() => onMove('down')}
      >
        {across ? '→' : '↓'}
      </Button>
    </span>
  );
}
