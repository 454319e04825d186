// An order line as it is stored: what was sold, copied from the menu at the time of sale, so later
// menu edits never rewrite history. Used by the Counter's orders and by the history generator.
import type { ResolvedLine } from '@/domain/order-lines';

export function orderItemRow(line: ResolvedLine, orderId: number, lineNo: number) {
  return {
    order_id: orderId,
    menu_item_id: line.menuItemId,
    line_no: lineNo,
    item_name: line.itemName,
    station: line.station,
    size_id: line.size?.id ?? null,
    size_name: line.size?.name ?? null,
    volume_ml: line.size?.volumeMl ?? null,
    milk_id: line.milk?.id ?? null,
    milk_name: line.milk?.name ?? null,
    milk_code: line.milk?.code ?? null,
    shots: line.shots,
    milk_ml: line.milkMl,
    dose_dg: line.doseDg,
    texture: line.texture,
    kids_temp: line.kidsTemp,
    extras: JSON.stringify(line.extras),
    contains: JSON.stringify(line.contains),
    note: line.note,
    price_cents: line.priceCents,
  };
}
