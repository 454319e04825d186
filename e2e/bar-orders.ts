// Orders placed straight through the API as the cashier, for the Bar specs.
import { request as apiRequest, type APIRequestContext } from '@playwright/test';
import { DEMO_PASSWORD, expect, type Login } from './fixtures';

export async function apiAs(baseURL: string, login: Login = 'cashier'): Promise<APIRequestContext> {
  const api = await apiRequest.newContext({ baseURL });
  expect((await api.post('/api/session', { data: { username: login, password: DEMO_PASSWORD } })).status()).toBe(200);
  return api;
}
export const cashierApi = (baseURL: string) => apiAs(baseURL, 'cashier');

export type Line = { item: string; milk?: string; size?: string; extras?: string[] };

export async function order(api: APIRequestContext, name: string, items: Line[], extra = {}) {
  const menu = await (await api.get('/api/menu')).json();
  const lines = items.map(({ item, milk, size, extras }) => {
    const m = menu.items.find((i: { name: string }) => i.name === item);
    return {
      menuItemId: m.id,
      milkId: milk ? menu.milks.find((x: { name: string }) => x.name === milk).id : undefined,
      sizeId: size ? m.sizes.find((s: { name: string }) => s.name === size).id : undefined,
      extraIds: extras?.map((n) => menu.extras.find((x: { name: string }) => x.name === n).id),
    };
  });
  const res = await api.post('/api/orders', {
    data: { clientOrderId: crypto.randomUUID(), customerName: name, items: lines, payment: { method: 'cash', tenderedCents: 10_000 }, ...extra },
  });
  expect(res.status(), await res.text()).toBe(201);
  return (await res.json()).order as { id: number; number: number };
}
