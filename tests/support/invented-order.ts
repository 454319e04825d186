// An invented order as the Counter's read shows it, for the tests of what is mailed about it (the
// receipt, the ready mail); a test changes what it needs through `over`.
import type { OrderView } from '@/domain/types';

export function inventedOrder(over: Partial<OrderView> = {}): OrderView {
  return {
    id: 7,
    clientOrderId: '5b3f4d5e-7c1a-4b2e-9a51-0c6f1e2d3a4b',
    number: 42,
    customerName: 'Maud Gallant',
    status: 'open',
    paymentStatus: 'paid',
    service: 'takeaway',
    allergens: [],
    allergyNote: null,
    customerEmail: null,
    lines: [
      {
        id: 1,
        menuItemId: 3,
        itemName: 'Latte',
        station: 'bar',
        sizeName: 'Large',
        milkName: 'Oat',
        shots: 3,
        extras: ['Vanilla syrup', 'Extra hot'],
        note: 'half sweet',
        priceCents: 790,
      },
      {
        id: 2,
        menuItemId: 9,
        itemName: 'Butter croissant',
        station: 'counter',
        sizeName: null,
        milkName: null,
        shots: 0,
        extras: [],
        note: null,
        priceCents: 425,
      },
    ],
    subtotalCents: 1215,
    discountCents: 0,
    discountReason: null,
    taxCents: 100,
    totalCents: 1315,
    tipCents: 0,
    refundedCents: 0,
    payment: { method: 'cash', tenderedCents: 2000, changeCents: 685, providerId: null, parts: [] },
    changeCents: 685,
    quotedWaitSeconds: null,
    takenBy: null,
    createdAt: '2026-03-02T14:05:00.000Z',
    firedAt: '2026-03-02T14:05:00.000Z',
    voidReason: null,
    ...over,
  };
}
