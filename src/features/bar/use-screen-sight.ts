// What of the Bar is in sight, measured in the browser after layout: the cards a barista can see
// (the only ones given bump keys), how many cards each lane hides below its edge, and which lanes
// stand off the screen's sides (named in the signpost, never silently). The server's HTML and the
// first render show none of it, so hydration matches.
import { useEffect, useState, type RefObject } from 'react';

export interface Sight {
  /** Ids of the cards in sight, in screen order (lane by lane, top down). */
  visible: number[];
  /** Lane key → cards below its edge. */
  hiddenBelow: Record<string, number>;
  /** Keys of the lanes not wholly on screen, left of it and right of it. */
  offLeft: string[];
  offRight: string[];
}

const NONE: Sight = { visible: [], hiddenBelow: {}, offLeft: [], offRight: [] };
/** A card counts as in sight when the middle of its head (where its key is) shows. */
const HEAD_PX = 80;

function measure(main: HTMLElement): Sight {
  const m = main.getBoundingClientRect();
  const left = Math.max(m.left, 0) - 1;
  const right = Math.min(m.right, window.innerWidth) + 1;
  const sight: Sight = { visible: [], hiddenBelow: {}, offLeft: [], offRight: [] };
  for (const lane of main.querySelectorAll<HTMLElement>('[data-testid="lane"]')) {
    const key = lane.dataset.laneKey!;
    const r = lane.getBoundingClientRect();
    const off = r.left < left || r.right > right;
    // a lane cut by the left edge is signposted on the left, one cut by the right edge on the right
    if (off) (r.left < left ? sight.offLeft : sight.offRight).push(key);
    const box = lane.querySelector<HTMLElement>('[data-testid="lane-cards"]')!.getBoundingClientRect();
    let below = 0;
    for (const card of lane.querySelectorAll<HTMLElement>('[data-testid="drink-card"]')) {
      const c = card.getBoundingClientRect();
      const head = c.top + Math.min(c.height, HEAD_PX) / 2;
      if (head > box.bottom) below++;
      else if (!off && head >= Math.max(box.top, m.top, 0) && head <= Math.min(m.bottom, window.innerHeight)) sight.visible.push(Number(card.dataset.drinkId));
    }
    sight.hiddenBelow[key] = below;
  }
  return sight;
}

const same = (a: Sight, b: Sight) => JSON.stringify(a) === JSON.stringify(b);

export function useScreenSight(ref: RefObject<HTMLElement | null>, contentKey: string): Sight {
  const [sight, setSight] = useState<Sight>(NONE);
  useEffect(() => {
    const main = ref.current;
    if (!main) return;
    const update = () =>
      setSight((prev) => {
        const next = measure(main);
        return same(prev, next) ? prev : next;
      });
    update();
    // any scroll (the page, the lane row, a lane's cards) and any resize changes what is in sight
    document.addEventListener('scroll', update, { capture: true, passive: true });
    window.addEventListener('resize', update);
    const resize = new ResizeObserver(update);
    resize.observe(main);
    main.querySelectorAll('[data-testid="lane"]').forEach((l) => resize.observe(l));
    return () => {
      document.removeEventListener('scroll', update, { capture: true });
      window.removeEventListener('resize', update);
      resize.disconnect();
    };
  }, [ref, contentKey]);
  return sight;
}
