// The bar's keyboard, as a bump bar: 1–9 bump the card showing that key (keys sit only on cards
// in sight and stay with a card while it shows: src/domain/bump-keys.ts), arrows move a focus ring, Enter bumps
// the focused card, S starts it, A acknowledges its allergy, R recalls the last bump. On a card
// whose allergy is unread a bump key only focuses it.
import { useEffect } from 'react';
import { needsAllergyAck, type LaneDrink } from '@/domain/lanes';
import type { BarCommand } from './commands';

interface Options {
  /** Every card in screen order (the arrows walk them). */
  cards: LaneDrink[];
  /** Card id → its bump key. */
  keys: ReadonlyMap<number, number>;
  focusId: number | null;
  setFocusId(id: number | null): void;
  run(c: BarCommand): void;
  recallLast: number | null;
}

export function useBumpKeys({ cards, keys, focusId, setFocusId, run, recallLast }: Options) {
  useEffect(() => {
    const onKey = (e: KeyboardEvent) => {
      if (e.altKey || e.ctrlKey || e.metaKey || (e.target as HTMLElement | null)?.closest('input, textarea, select')) return;
      const at = cards.findIndex((c) => c.id === focusId);
      const focused = at >= 0 ? cards[at] : undefined;
      const bump = (card: LaneDrink | undefined) => {
        if (!card) return;
        // An unread allergy is never read by a bump key: the key only moves the focus ring there,
        // and the barista confirms with A (or the card's button) as a separate, deliberate act.
        if (needsAllergyAck(card)) return setFocusId(card.id);
        run({ kind: 'bump-drink', id: card.id });
      };
      const n = Number(e.key);
      if (n >= 1 && n <= 9) return bump(cards.find((c) => keys.get(c.id) === n));
      switch (e.key) {
        case 'ArrowDown':
        case 'ArrowRight':
          e.preventDefault();
          return setFocusId(cards[Math.min(cards.length - 1, at + 1)]?.id ?? null);
        case 'ArrowUp':
        case 'ArrowLeft':
          e.preventDefault();
          return setFocusId(cards[Math.max(0, at - 1)]?.id ?? null);
        case 'Enter':
          return bump(focused);
        case 's':
        case 'S':
          if (focused?.status === 'queued') run({ kind: 'start-drink', id: focused.id });
          return;
        case 'a':
        case 'A':
          if (focused && needsAllergyAck(focused)) run({ kind: 'acknowledge-allergy', id: focused.id });
          return;
        case 'r':
        case 'R':
          if (recallLast !== null) run({ kind: 'recall-ticket', id: recallLast });
          return;
      }
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, [cards, keys, focusId, setFocusId, run, recallLast]);
}
