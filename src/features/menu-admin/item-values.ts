// An item as its form holds it (grams and prices as the owner reads them), and back.
import type { ItemFormValues, SizeFormValues } from '@/domain/menu-admin-schemas';
import type { AdminItem, AdminSize } from '@/domain/menu-admin-view';
import { centsToAmountText, dgToGramsText } from '@/domain/menu-units';

export function sizeValues(s: AdminSize | null, isDefault: boolean): SizeFormValues {
  if (!s) return { name: '', volumeMl: '', cup: '', price: '', shots: '0', doseG: '', yieldG: '', milkMl: '', isDefault };
  return {
    sizeId: s.id,
    name: s.name,
    volumeMl: String(s.volumeMl),
    cup: s.cup ?? '',
    price: centsToAmountText(s.priceCents),
    shots: String(s.shots),
    doseG: s.doseDg ? dgToGramsText(s.doseDg) : '',
    yieldG: s.yieldDg ? dgToGramsText(s.yieldDg) : '',
    milkMl: s.milkMl ? String(s.milkMl) : '',
    isDefault,
  };
}

export function itemValues(item: AdminItem | null, categoryId: number): ItemFormValues {
  if (!item) {
    return {
      categoryId: String(categoryId),
      name: '',
      station: 'bar',
      price: '',
      takesMilk: false,
      defaultMilkId: '',
      texture: '',
      ingredients: [],
      extraGroupIds: [],
      sizes: [sizeValues(null, true)],
    };
  }
  return {
    categoryId: String(item.categoryId),
    name: item.name,
    station: item.station,
    price: item.priceCents === null ? '' : centsToAmountText(item.priceCents),
    takesMilk: item.takesMilk,
    defaultMilkId: item.defaultMilkId === null ? '' : String(item.defaultMilkId),
    texture: item.texture ?? '',
    ingredients: item.ingredients,
    extraGroupIds: item.extraGroupIds,
    sizes: item.sizes.filter((s) => !s.retired).map((s) => sizeValues(s, s.isDefault)),
  };
}
