import { describe, it, expect } from 'vitest';
import { CAPABILITIES, HOME_SCREEN, ROLES, can } from '@/domain/roles';
import { clientMessage, createOrderBody, orderLineInput } from '@/domain/schemas';

describe('can / CAPABILITIES', () => {
  it('lets a lead take orders and make drinks', () => {
    expect(can('lead', 'takeOrders')).toBe(true);
    expect(can('lead', 'makeDrinks')).toBe(true);
  });

  it('does not let a cashier make drinks, nor a barista take orders', () => {
    expect(can('cashier', 'makeDrinks')).toBe(false);
    expect(can('cashier', 'takeOrders')).toBe(true);
    expect(can('barista', 'takeOrders')).toBe(false);
    expect(can('barista', 'makeDrinks')).toBe(true);
  });

  it('lets an owner do everything and nobody signed out do anything', () => {
    for (const cap of Object.keys(CAPABILITIES) as (keyof typeof CAPABILITIES)[]) {
      expect(can('owner', cap)).toBe(true);
      expect(can(undefined, cap)).toBe(false);
      expect(can(null, cap)).toBe(false);
    }
  });

  it('gives every role a home screen', () => {
    for (const role of ROLES) expect(HOME_SCREEN[role]).toMatch(/^\//);
  });
});

const goodOrder = {
  clientOrderId: '3f0c7a52-9b1e-4d2a-8c4f-1a2b3c4d5e6f',
  customerName: 'Ash',
  items: [{ menuItemId: 4 }],
  payment: { method: 'cash', tenderedCents: 1000 },
};

describe('createOrderBody', () => {
  it('accepts a well-formed order', () => {
    expect(createOrderBody.safeParse(goodOrder).success).toBe(true);
  });

  it('rejects a clientOrderId that is not a uuid', () => {
    expect(createOrderBody.safeParse({ ...goodOrder, clientOrderId: 'order-1' }).success).toBe(false);
  });

  it('rejects an order with no items', () => {
    expect(createOrderBody.safeParse({ ...goodOrder, items: [] }).success).toBe(false);
  });

  it('rejects a missing or blank customer name', () => {
    const { customerName: _omit, ...noName } = goodOrder;
    void _omit;
    expect(createOrderBody.safeParse(noName).success).toBe(false);
    expect(createOrderBody.safeParse({ ...goodOrder, customerName: '   ' }).success).toBe(false);
  });

  it('rejects a payment method other than cash', () => {
    expect(createOrderBody.safeParse({ ...goodOrder, payment: { method: 'card', tenderedCents: 0 } }).success).toBe(false);
  });
});

describe('orderLineInput', () => {
  it('rejects more than 8 shots and a negative count', () => {
    expect(orderLineInput.safeParse({ menuItemId: 1, shots: 8 }).success).toBe(true);
    expect(orderLineInput.safeParse({ menuItemId: 1, shots: 9 }).success).toBe(false);
    expect(orderLineInput.safeParse({ menuItemId: 1, shots: -1 }).success).toBe(false);
  });
});

describe('clientMessage', () => {
  it('accepts resume and ping', () => {
    expect(clientMessage.safeParse({ type: 'resume', since: 0 }).success).toBe(true);
    expect(clientMessage.safeParse({ type: 'ping' }).success).toBe(true);
  });

  it('rejects unknown types and a resume without a sequence', () => {
    expect(clientMessage.safeParse({ type: 'subscribe' }).success).toBe(false);
    expect(clientMessage.safeParse({ type: 'resume' }).success).toBe(false);
    expect(clientMessage.safeParse({ type: 'resume', since: -1 }).success).toBe(false);
  });
});
