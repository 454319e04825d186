// The item sheet: size, milk, shots and extras for one drink, as big touch choices.
import { useEffect, useRef, useState } from 'react';
import { formatCents } from '@/domain/money';
import { resolveLine } from '@/domain/order-lines';
import type { OrderLineInput } from '@/domain/schemas';
import type { MenuItemView, MenuView } from '@/domain/types';
import { cupSizeLabel } from '@/domain/units';
import { Button } from '@/components/ui/button';
import { Segmented } from '@/components/ui/segmented';
import { useModalFocus } from '@/components/ui/use-modal-focus';
import { cn } from '@/lib/cn';

interface Props {
  menu: MenuView;
  item: MenuItemView;
  initial?: OrderLineInput;
  onAdd(line: OrderLineInput): void;
  onClose(): void;
}

export function ItemSheet({ menu, item, initial, onAdd, onClose }: Props) {
  const defaultSize = item.sizes.find((s) => s.isDefault) ?? item.sizes[0];
  const groups = menu.extraGroups
    .filter((g) => item.extraGroupIds.includes(g.id))
    .map((group) => ({ group, options: menu.extras.filter((m) => m.groupId === group.id) }));
  const [line, setLine] = useState<OrderLineInput>(
    initial ?? {
      menuItemId: item.id,
      sizeId: defaultSize?.id,
      milkId: item.takesMilk ? (item.defaultMilkId ?? undefined) : undefined,
      // a required choice with one option is no choice: it is made already
      extraIds: groups.filter(({ group, options }) => group.required && options.length === 1).map(({ options }) => options[0].id),
    },
  );
  const priced = resolveLine(menu, line);
  const panel = useRef<HTMLDivElement>(null);
  // the focus starts on the chosen size (or milk) and stays in the sheet; back on the tile after
  useModalFocus(panel, (box) => box.querySelector<HTMLElement>('[role="radio"][aria-checked="true"]'));

  // Esc closes the sheet; Enter adds the drink — even right after tapping a choice, which would
  // otherwise press that choice again (only the note field keeps Enter for itself).
  useEffect(() => {
    const onKey = (e: KeyboardEvent) => {
      if (e.key === 'Escape') onClose();
      else if (e.key === 'Enter' && !(e.target as HTMLElement | null)?.closest('input, textarea')) {
        e.preventDefault();
        if (priced.ok) onAdd(line);
      }
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, [line, priced.ok, onAdd, onClose]);
  const recipeShots = (item.sizes.find((s) => s.id === line.sizeId) ?? defaultSize)?.shots ?? item.shots;
  const shots = line.shots ?? recipeShots;
  const money = (c: number) => formatCents(c, menu.location.currency);
  /** In a pick-one group, choosing an extra replaces the group's other choice. */
  const toggleExtra = (id: number, singleGroupId: number | null) => {
    const ids = line.extraIds ?? [];
    if (ids.includes(id)) return setLine({ ...line, extraIds: ids.filter((x) => x !== id) });
    const others = singleGroupId === null ? ids : ids.filter((x) => menu.extras.find((m) => m.id === x)?.groupId !== singleGroupId);
    setLine({ ...line, extraIds: [...others, id] });
  };

  return (
    <div role="dialog" aria-modal="true" aria-label={item.name} className="fixed inset-0 z-20 flex flex-col justify-end bg-ink-900/40">
      {/* the backdrop: a tap closes; the keyboard has Cancel and Esc */}
      <button type="button" aria-label="Close" tabIndex={-1} className="flex-1 cursor-default" onClick={onClose} />
      <div ref={panel} className="flex max-h-[92dvh] flex-col rounded-t-2xl bg-steam-50 shadow-2xl">
        <div className="overflow-y-auto px-6 pt-5 pb-3">
          <div className="flex items-baseline gap-4">
            <h2 className="text-3xl font-semibold">{item.name}</h2>
            <span className="text-2xl text-ink-600">{priced.ok ? money(priced.line.priceCents) : ''}</span>
            <Button tone="quiet" className="ml-auto" onClick={onClose}>
              Cancel
            </Button>
          </div>
          {priced.ok && priced.line.contains.length > 0 && (
            // everything this drink holds as made now: the item itself, its milk and its extras
            <p data-testid="sheet-contains" className="mt-1 text-lg">
              <span className="font-semibold">Contains:</span> {priced.line.contains.join(', ')}
            </p>
          )}
          <div data-first-choice className="mt-4 flex flex-col gap-4">
            {item.sizes.length > 1 && (
              <Segmented
                label="Size"
                value={line.sizeId}
                onChange={(sizeId) => setLine({ ...line, sizeId, shots: undefined })}
                options={item.sizes.map((s) => ({
                  value: s.id,
                  label: s.name,
                  hint: `${cupSizeLabel(s.volumeMl, menu.location.volumeUnit ?? 'ml')} · ${money(s.priceCents)}`,
                }))}
              />
            )}
            {item.takesMilk && (
              <Segmented
                label="Milk"
                value={line.milkId}
                onChange={(milkId) => setLine({ ...line, milkId })}
                options={menu.milks.map((m) => ({
                  value: m.id,
                  label: m.name,
                  hint:
                    [m.upchargeCents && m.id !== item.defaultMilkId ? `+${money(m.upchargeCents)}` : '', m.allergens.join(', ')].filter(Boolean).join(' · ') ||
                    undefined,
                }))}
              />
            )}
            {recipeShots > 0 && (
              <fieldset>
                <legend className="mb-1 text-sm font-semibold tracking-widest text-ink-600 uppercase">Shots</legend>
                <div className="flex items-center gap-3">
                  <Button tone="quiet" size="lg" aria-label="One shot fewer" disabled={shots <= 1} onClick={() => setLine({ ...line, shots: shots - 1 })}>
                    −
                  </Button>
                  <output aria-live="polite" className="w-28 text-center text-2xl font-semibold">
                    {shots} shot{shots === 1 ? '' : 's'}
                  </output>
                  <Button tone="quiet" size="lg" aria-label="One shot more" disabled={shots >= 6} onClick={() => setLine({ ...line, shots: shots + 1 })}>
                    +
                  </Button>
                  {shots > recipeShots && (
                    <span className="text-lg text-ink-600">+{money((shots - recipeShots) * menu.location.extraShotCents)} extra shot</span>
                  )}
                </div>
              </fieldset>
            )}
            {groups.map(({ group, options }) => (
              <fieldset key={group.id}>
                <legend className="mb-1 text-sm font-semibold tracking-widest text-ink-600 uppercase">
                  {group.name}
                  {/* "pick one" only where there is more than one to pick from */}
                  {group.selection === 'single' && options.length > 1 ? ' · pick one' : ''}
                  {group.required && options.length > 1 ? ' · required' : ''}
                </legend>
                <div className="flex flex-wrap gap-2">
                  {options.map((m) => {
                    const on = line.extraIds?.includes(m.id) ?? false;
                    return (
                      <button
                        key={m.id}
                        type="button"
                        aria-pressed={on}
                        onClick={() => toggleExtra(m.id, group.selection === 'single' ? group.id : null)}
                        className={cn(
                          'min-h-14 rounded-lg border-2 px-4 text-lg font-semibold',
                          on ? 'border-ink-900 bg-ink-900 text-steam-50' : 'border-steam-200 bg-white',
                        )}
                      >
                        {on && <span aria-hidden>✓ </span>}
                        {m.name}
                        {m.priceCents > 0 && <span className="ml-1 text-sm font-medium">+{money(m.priceCents)}</span>}
                        {m.allergens.length > 0 && <span className="ml-1 text-sm font-medium">⚠ {m.allergens.join(', ')}</span>}
                      </button>
                    );
                  })}
                </div>
              </fieldset>
            ))}
            <label className="block">
              <span className="mb-1 block text-sm font-semibold tracking-widest text-ink-600 uppercase">Note for the bar</span>
              <input
                className="w-full rounded-lg border border-steam-200 bg-white px-3 py-3 text-lg"
                maxLength={140}
                value={line.note ?? ''}
                onChange={(e) => setLine({ ...line, note: e.target.value || undefined })}
              />
            </label>
          </div>
        </div>
        {/* pinned, so a 768 px tablet never scrolls to add a drink */}
        <div className="border-t border-steam-200 px-6 py-3">
          {!priced.ok && (
            <p role="alert" className="mb-2 font-semibold text-copper-700">
              {priced.problem.message}
            </p>
          )}
          <Button size="xl" className="w-full" disabled={!priced.ok} onClick={() => onAdd(line)}>
            {initial ? 'Update line' : 'Add to order'} {priced.ok ? `· ${money(priced.line.priceCents)}` : ''}
          </Button>
        </div>
      </div>
    </div>
  );
}
