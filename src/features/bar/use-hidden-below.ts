// How many drink cards of a lane are out of sight below its scroll edge, so the lane can say
// "4 more below" instead of silently cutting them off. Counted in the browser after layout; the
// server's HTML (and the first render) shows none, so hydration matches.
import { useEffect, useState, type RefObject } from 'react';

export function useHiddenBelow(ref: RefObject<HTMLElement | null>, contentKey: string): number {
  const [hidden, setHidden] = useState(0);
  useEffect(() => {
    const box = ref.current;
    if (!box) return;
    const count = () => {
      const edge = box.getBoundingClientRect().bottom;
      const cards = box.querySelectorAll<HTMLElement>('[data-testid="drink-card"]');
      // a card counts as hidden once less than half of it shows
      setHidden([...cards].filter((c) => {
        const r = c.getBoundingClientRect();
        return r.top + r.height / 2 > edge;
      }).length);
    };
    count();
    box.addEventListener('scroll', count, { passive: true });
    const resize = new ResizeObserver(count);
    resize.observe(box);
    return () => {
      box.removeEventListener('scroll', count);
      resize.disconnect();
    };
  }, [ref, contentKey]);
  return hidden;
}
