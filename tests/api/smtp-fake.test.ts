// The SMTP fake and the mailer on their own, and SMTP_URL: with a mail server configured the app
// sends there and starts no fake of its own.
import { randomBytes } from 'node:crypto';
import { mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Config } from '@server/config';
import { startSmtpFake, type ReceivedMail, type SmtpFake } from '@server/fakes/smtp-fake';
import { startServer } from '@server/server';
import { createMailer } from '@server/mail/outbox';
import { DEMO_PASSWORD } from '@seeds/demo-cafe';
import { orderBody } from './helpers';

let fake: SmtpFake;
const received: ReceivedMail[] = [];

beforeAll(async () => {
  fake = await startSmtpFake({ onMessage: (mail) => void received.push(mail) });
});
afterAll(() => fake.close());

describe('the mailer against the SMTP fake', () => {
  it('sends over an smtp:// URL and the fake parses every field', async () => {
    const mailer = createMailer({ url: `smtp://127.0.0.1:${fake.port}` }, { name: 'Jugline', address: 'receipts@jugline.local' });
    const { messageId } = await mailer.send({
      to: ['a@example.com', 'b@example.com'],
      subject: 'Über café',
      text: 'plain words',
      html: '<p>html words</p>',
      fromName: 'Harbour & Hearth Coffee',
      locationId: 3,
    });
    mailer.close();
    const mail = received.find((m) => m.messageId === messageId);
    expect(mail).toMatchObject({
      from: '"Harbour & Hearth Coffee" <receipts@jugline.local>',
      to: ['a@example.com', 'b@example.com'],
      subject: 'Über café',
      text: 'plain words',
      html: '<p>html words</p>',
      locationId: 3,
      receivedAt: expect.stringMatching(/Z$/),
    });
  });

  it('refuses a message over 1 MB, and stores nothing', async () => {
    const mailer = createMailer({ host: fake.host, port: fake.port }, { name: 'Jugline', address: 'receipts@jugline.local' });
    const before = received.length;
    await expect(mailer.send({ to: 'a@example.com', subject: 'big', text: 'x'.repeat(1_100_000) })).rejects.toMatchObject({
      responseCode: 552,
    });
    mailer.close();
    expect(received.length).toBe(before);
  });
});

describe('SMTP_URL set', () => {
  it('sends receipts to that server, so the outbox stays empty', async () => {
    const dir = mkdtempSync(path.join(os.tmpdir(), 'jugline-smtp-'));
    const config: Config = {
      env: 'test',
      port: 0,
      host: '127.0.0.1',
      databaseFile: path.join(dir, 'jugline.sqlite'),
      sessionSecret: randomBytes(32).toString('hex'),
      seedDemo: true,
      smtpUrl: `smtp://127.0.0.1:${fake.port}`,
    };
    const running = await startServer(config, { pages: 'none', log: () => {} });
    try {
      const cashier = request.agent(running.url);
      await cashier.post('/api/session').send({ username: 'cashier', password: DEMO_PASSWORD });
      const item = await running.db('menu_items').where({ name: 'Espresso' }).first('id');
      const placed = await cashier.post('/api/orders').send(orderBody('Dee', [{ menuItemId: item.id }]));
      expect(placed.status).toBe(201);
      const res = await cashier.post(`/api/orders/${placed.body.order.id}/receipt`).send({ email: 'dee@example.com' });
      expect(res.status).toBe(202);
      expect(received.find((m) => m.messageId === res.body.messageId)?.to).toEqual(['dee@example.com']);
      expect(Number((await running.db('outbox').count({ n: '*' }).first())?.n)).toBe(0);
    } finally {
      await running.close();
      rmSync(dir, { recursive: true, force: true });
    }
  });
});
