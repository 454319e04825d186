import { useEffect, useState } from 'react';
import { formatCents } from '@/domain/money';
import type { MenuItemView, MenuView } from '@/domain/types';
import { cn } from '@/lib/cn';

export function fromPrice(item: MenuItemView): number {
  return item.sizes.length ? Math.min(...item.sizes.map((s) => s.priceCents)) : (item.priceCents ?? 0);
}

export function MenuGrid({ menu, onPick }: { menu: MenuView; onPick(item: MenuItemView): void }) {
  const [categoryId, setCategoryId] = useState(menu.categories[0]?.id);
  const items = menu.items.filter((i) => i.categoryId === categoryId);

  // Keys 1–9 pick the Nth tile of the open category (not while typing or with a sheet open).
  useEffect(() => {
    const onKey = (e: KeyboardEvent) => {
      const target = e.target as HTMLElement | null;
      if (e.altKey || e.ctrlKey || e.metaKey || target?.closest('input, textarea, select, [role="dialog"]')) return;
      if (document.querySelector('[role="dialog"]')) return;
      const n = Number(e.key);
      const item = n >= 1 && n <= 9 ? items[n - 1] : undefined;
      if (item?.available) {
        e.preventDefault();
        onPick(item);
      }
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, [items, onPick]);

  return (
    <div className="flex min-h-0 flex-col">
      <div role="tablist" aria-label="Menu categories" className="flex shrink-0 flex-wrap gap-1">
        {menu.categories.map((c) => (
          <button
            key={c.id}
            role="tab"
            type="button"
            aria-selected={c.id === categoryId}
            onClick={() => setCategoryId(c.id)}
            className={cn(
              'min-h-14 shrink-0 rounded-t-lg border-b-4 px-4 text-lg font-semibold whitespace-nowrap',
              c.id === categoryId ? 'border-copper-700 bg-steam-100' : 'border-transparent text-ink-600',
            )}
          >
            {c.name}
          </button>
        ))}
      </div>
      <div role="tabpanel" className="grid grid-cols-[repeat(auto-fill,minmax(10rem,1fr))] gap-3 overflow-y-auto pt-3">
        {items.map((item, index) => (
          <button
            key={item.id}
            type="button"
            disabled={!item.available}
            onClick={() => onPick(item)}
            className="flex min-h-24 flex-col items-start justify-between rounded-xl border border-steam-200 bg-white p-3 text-left shadow-sm hover:border-copper-500 disabled:bg-steam-100 disabled:opacity-60"
          >
            <span className="flex w-full items-baseline justify-between gap-2">
              <span className="text-xl leading-tight font-semibold">{item.name}</span>
              {index < 9 && (
                <kbd aria-hidden className="text-sm text-ink-600">
                  {index + 1}
                </kbd>
              )}
            </span>
            <span className="flex w-full items-end justify-between gap-2">
              <span className="text-base text-ink-600">
                {item.available ? `${item.sizes.length > 1 ? 'from ' : ''}${formatCents(fromPrice(item), menu.location.currency)}` : "86'd — unavailable"}
              </span>
              {/* the item's photo (back office, Menu → Item photos); decorative: the name says what it is */}
              {item.photoUrl && <img src={item.photoUrl} alt="" loading="lazy" className="h-12 w-12 shrink-0 rounded-md object-cover" />}
            </span>
          </button>
        ))}
      </div>
    </div>
  );
}
