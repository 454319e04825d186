// A milk at a glance: its full name beside a shape of its own (circle, triangle, square…), taken
// from the milk's place in the menu, so the same milk wears the same shape on every screen and no
// two milks of a menu of up to eight share one. Shape and name, never colour alone.
import type { MilkRef } from '@/domain/types';

const SHAPES = [
  'M12 3a9 9 0 1 0 0 18a9 9 0 1 0 0-18z', // circle
  'M12 3l10 18H2z', // triangle
  'M4 4h16v16H4z', // square
  'M12 2l10 10l-10 10L2 12z', // diamond
  'M7 3h10l5 9l-5 9H7l-5-9z', // hexagon
  'M12 2l2.9 6.6L22 9.3l-5.4 4.8L18.2 21L12 17.3L5.8 21l1.6-6.9L2 9.3l7.1-.7z', // star
  'M12 2l10 7.5l-3.8 12H5.8L2 9.5z', // pentagon
  'M9 2h6v7h7v6h-7v7H9v-7H2V9h7z', // cross
];

export function MilkShape({ milk, className = 'size-8' }: { milk: MilkRef | null; className?: string }) {
  const d = milk ? SHAPES[(milk.sort ?? milk.id) % SHAPES.length] : null;
  return (
    <svg viewBox="0 0 24 24" aria-hidden="true" className={`${className} shrink-0`} data-testid="milk-shape">
      {d ? <path d={d} fill="currentColor" /> : <path d="M4 12h16" stroke="currentColor" strokeWidth="3" />}
    </svg>
  );
}
