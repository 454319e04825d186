// A wide table's own sideways scroll, so the page never scrolls sideways on a phone. The box is a
// named region and takes focus, so a keyboard can scroll it and a screen reader says what it holds.
import type { ReactNode } from 'react';
import { cn } from '@/lib/cn';

export function ScrollBox({ label, className, children }: { label: string; className?: string; children: ReactNode }) {
  return (
    // tabIndex: a scrolling region must be reachable by keyboard (WCAG 2.1.1)
    <div role="region" aria-label={label} tabIndex={0} className={cn('relative max-w-full overflow-x-auto', className)}>
      {children}
    </div>
  );
}
