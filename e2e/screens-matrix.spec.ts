// Every screen × every role → the expected answer, generated from the one screens table, so a new
// screen can't ship without its row. Signed out → sign-in and back; without the capability → 403.
import { CAPABILITIES, ROLES, type Role } from '@/domain/roles';
import { SCREENS } from '@/domain/screens';
import { DEMO_PASSWORD, expect, test } from './fixtures';

const LOGIN: Record<Role, string> = { cashier: 'cashier', barista: 'barista', lead: 'lead', owner: 'owner' };

test('screens × roles', async ({ playwright, baseURL }) => {
  const cashier = await playwright.request.newContext({ baseURL });
  await cashier.post('/api/session', { data: { username: 'cashier', password: DEMO_PASSWORD } });
  const menu = await (await cashier.get('/api/menu')).json();
  const made = await cashier.post('/api/orders', {
    data: {
      clientOrderId: crypto.randomUUID(),
      customerName: 'Wes Harlan',
      items: [{ menuItemId: menu.items.find((i: { name: string }) => i.name === 'Espresso').id }],
      payment: { method: 'cash', tenderedCents: 500 },
    },
  });
  const orderId = (await made.json()).order.id;
  await cashier.dispose();

  const screens = Object.values(SCREENS).map((s) => ({ ...s, url: s.path.replace(':id', String(orderId)) }));
  const anon = await playwright.request.newContext({ baseURL });
  for (const s of screens) {
    const res = await anon.get(s.url, { maxRedirects: 0 });
    expect(res.status(), `${s.url} signed out`).toBe(302);
    expect(res.headers()['location']).toBe(`/signin?next=${encodeURIComponent(s.url)}`);
  }
  await anon.dispose();

  for (const role of ROLES) {
    const ctx = await playwright.request.newContext({ baseURL });
    await ctx.post('/api/session', { data: { username: LOGIN[role], password: DEMO_PASSWORD } });
    for (const s of screens) {
      const allowed = (CAPABILITIES[s.need] as readonly Role[]).includes(role);
      const res = await ctx.get(s.url, { maxRedirects: 0 });
      expect(res.status(), `${s.url} as ${role}`).toBe(allowed ? 200 : 403);
    }
    await ctx.dispose();
  }
});
