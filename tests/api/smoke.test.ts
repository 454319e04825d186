import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startTestServer, type TestServer } from '../support/test-server';

let server: TestServer;
beforeAll(async () => {
  server = await startTestServer();
});
afterAll(() => server.close());

describe('smoke', () => {
  it('signs in and reads the menu', async () => {
    const agent = await server.signIn('cashier');
    const res = await agent.get('/api/menu');
    expect(res.status).toBe(200);
    expect(res.body.items.length).toBeGreaterThan(5);
  });
});
