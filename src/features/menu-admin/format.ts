import { formatCents } from '@/domain/money';
import type { AdminMenuView } from '@/domain/menu-admin-view';

/** Money in the café's currency and locale. */
export const moneyOf = (menu: AdminMenuView) => (cents: number) => formatCents(cents, menu.location.currency, menu.location.locale);

export const TEXTURE_HINT = {
  flat: 'flat — hardly any foam',
  silky: 'silky — a thin layer of microfoam',
  foamy: 'foamy — a tall cap of foam',
  cold: 'cold — poured from the fridge, no jug',
} as const;

/** "$" for USD in en-US: beside a price field. */
export function currencySign(menu: AdminMenuView): string {
  const parts = new Intl.NumberFormat(menu.location.locale, { style: 'currency', currency: menu.location.currency }).formatToParts(0);
  return parts.find((p) => p.type === 'currency')?.value ?? menu.location.currency;
}
