// Here or to go, as the Bar and the cup labels say it: in words and by a shape (a mug with a
// handle, a paper cup with a lid), never by colour alone.
import type { Service } from '@/domain/types';
import { cn } from '@/lib/cn';

export const serviceWords = (s: Service) => (s === 'dine_in' ? 'Here · mug' : 'To go · cup');

function Mug() {
  return (
    <svg viewBox="0 0 24 24" aria-hidden="true" className="size-[1.1em] shrink-0" fill="none" stroke="currentColor" strokeWidth="2.2" strokeLinejoin="round">
      <path d="M4 6h12v10a4 4 0 0 1-4 4H8a4 4 0 0 1-4-4z" />
      <path d="M16 9h2.5a2.5 2.5 0 0 1 0 5H16" />
    </svg>
  );
}

function PaperCup() {
  return (
    <svg viewBox="0 0 24 24" aria-hidden="true" className="size-[1.1em] shrink-0" fill="none" stroke="currentColor" strokeWidth="2.2" strokeLinejoin="round">
      <path d="M5 6h14" />
      <path d="M7 3h10l1 3H6z" />
      <path d="M6.5 6l1.6 15h7.8l1.6-15" />
    </svg>
  );
}

export function ServiceMark({ service, className }: { service: Service; className?: string }) {
  return (
    <span data-testid="service" data-service={service} className={cn('inline-flex items-center gap-1.5', className)}>
      {service === 'dine_in' ? <Mug /> : <PaperCup />}
      {serviceWords(service)}
    </span>
  );
}
