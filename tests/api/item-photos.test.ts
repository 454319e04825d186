// Item photos through the real server: owner only; only real JPEG/PNG/WebP bytes are taken, scaled
// to 800 px and stored as WebP without their metadata; too large or not an image saves nothing;
// a replaced or removed photo leaves no file behind.
import { existsSync, readdirSync } from 'node:fs';
import path from 'node:path';
import request from 'supertest';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startTestServer, demoMenu, type TestServer } from '../support/test-server';
import type { Agent } from './helpers';

let server: TestServer;
let owner: Agent;
let latteId: number;
let mochaId: number;
/** mediaDirOf(config): a `media` folder beside the test's database file */
let photoDir: string;

beforeAll(async () => {
  server = await startTestServer();
  owner = await server.signIn('owner');
  const menu = await demoMenu(server);
  latteId = menu.item('Latte');
  mochaId = menu.item('Mocha');
  photoDir = path.join(server.dir, 'media', 'menu');
});
afterAll(() => server.close());

const filesOnDisk = () => (existsSync(photoDir) ? readdirSync(photoDir).sort() : []);
const photoOf = async (id: number) => (await server.db('menu_items').where({ id }).first('photo')).photo as string | null;
const eventCount = async () => Number((await server.db('events').count({ n: '*' }).first())?.n);

const upload = (agent: Agent, id: number, bytes: Buffer, filename: string, contentType: string) =>
  agent.post(`/api/menu/items/${id}/photo`).attach('file', bytes, { filename, contentType });

/** A photo-like test image of our own: a copper gradient, made by sharp from raw pixels. */
async function testImage(width: number, height: number) {
  const raw = Buffer.alloc(width * height * 3);
  for (let y = 0; y < height; y++) {
    for (let x = 0; x < width; x++) {
      const i = (y * width + x) * 3;
      raw[i] = 200;
      raw[i + 1] = Math.round((116 * x) / width);
      raw[i + 2] = Math.round((58 * y) / height);
    }
  }
  return sharp(raw, { raw: { width, height, channels: 3 } });
}

async function served(url: string) {
  const res = await request(server.url)
    .get(url)
    .buffer(true)
    .parse((r, done) => {
      const chunks: Buffer[] = [];
      r.on('data', (c: Buffer) => chunks.push(c));
      r.on('end', () => done(null, Buffer.concat(chunks)));
    });
  return res;
}

describe('who may change photos', () => {
  it.each(['cashier', 'barista', 'lead'] as const)('%s gets 403 on upload and delete, and nothing is stored', async (login) => {
    const agent = await server.signIn(login);
    const png = await (await testImage(40, 30)).png().toBuffer();
    const before = filesOnDisk();
    expect((await upload(agent, latteId, png, 'latte.png', 'image/png')).status).toBe(403);
    expect((await agent.delete(`/api/menu/items/${latteId}/photo`)).status).toBe(403);
    expect(filesOnDisk()).toEqual(before);
    expect(await photoOf(latteId)).toBeNull();
  });
});

describe('uploading a photo', () => {
  let firstUrl: string;

  it('a PNG is scaled to fit 800 px, stored as WebP under a random name and served as image/webp', async () => {
    const events = await eventCount();
    const png = await (await testImage(1600, 1200)).png().toBuffer();
    const res = await upload(owner, latteId, png, 'my latte.png', 'image/png');
    expect(res.status).toBe(200);
    expect(res.body.item).toEqual({ id: latteId, photoUrl: expect.stringMatching(/^\/media\/menu\/[0-9a-f]{32}\.webp$/) });
    firstUrl = res.body.item.photoUrl;
    expect(filesOnDisk()).toEqual([path.basename(firstUrl)]);
    expect(await photoOf(latteId)).toBe(path.basename(firstUrl));
    expect(await eventCount()).toBe(events + 1);
    expect((await server.db('events').orderBy('id', 'desc').first()).type).toBe('menu.changed');

    const got = await served(firstUrl);
    expect(got.status).toBe(200);
    expect(got.headers['content-type']).toBe('image/webp');
    expect(got.headers['x-content-type-options']).toBe('nosniff');
    const meta = await sharp(got.body as Buffer).metadata();
    expect(meta).toMatchObject({ format: 'webp', width: 800, height: 600 });

    const menu = (await (await server.signIn('cashier')).get('/api/menu')).body;
    expect(menu.items.find((i: { id: number }) => i.id === latteId).photoUrl).toBe(firstUrl);
    expect(menu.items.find((i: { id: number }) => i.id === mochaId).photoUrl).toBeNull();
  });

  it('a JPEG replaces it: its camera metadata is dropped, a small photo is not enlarged, the old file is gone', async () => {
    const jpeg = await (
      await testImage(300, 200)
    )
      .jpeg()
      .withExif({ IFD0: { Copyright: 'Harbour test camera', Artist: 'Mara Quill' } })
      .toBuffer();
    expect((await sharp(jpeg).metadata()).exif).toBeDefined(); // the upload does carry EXIF
    const res = await upload(owner, latteId, jpeg, 'IMG_0001.JPG', 'image/jpeg');
    expect(res.status).toBe(200);
    const url = res.body.item.photoUrl as string;
    expect(url).not.toBe(firstUrl);
    expect(filesOnDisk()).toEqual([path.basename(url)]);
    expect((await served(firstUrl)).status).toBe(404);

    const meta = await sharp((await served(url)).body as Buffer).metadata();
    expect(meta).toMatchObject({ format: 'webp', width: 300, height: 200 });
    expect(meta.exif).toBeUndefined();
  });

  it('a WebP is taken too', async () => {
    const webp = await (await testImage(120, 90)).webp().toBuffer();
    const res = await upload(owner, mochaId, webp, 'mocha.webp', 'image/webp');
    expect(res.status).toBe(200);
    expect(filesOnDisk()).toHaveLength(2);
  });
});

describe('uploads that are refused save nothing', () => {
  async function expectNothingSaved(res: request.Response, status: number, message: RegExp) {
    expect(res.status).toBe(status);
    expect(res.body.error.message).toMatch(message);
  }

  it.each([
    ['a text file named .jpg', () => Buffer.from('this is not a photo, only words\n'), 'latte.jpg', 'image/jpeg', /not an image.*JPEG, PNG or WebP/],
    ['a GIF', async () => (await testImage(20, 20)).gif().toBuffer(), 'latte.gif', 'image/gif', /GIF image.*JPEG, PNG or WebP/],
    [
      'an SVG',
      () => Buffer.from('<svg xmlns="http://www.w3.org/2000/svg" width="10" height="10"><rect width="10" height="10"/></svg>'),
      'latte.svg',
      'image/svg+xml',
      /SVG image/,
    ],
    [
      'a PNG cut short',
      async () => (await (await testImage(200, 200)).png().toBuffer()).subarray(0, 300),
      'latte.png',
      'image/png',
      /could not be read|not an image/,
    ],
  ])('%s is 415 with a clear message', async (_what, make, filename, type, message) => {
    const before = { files: filesOnDisk(), photo: await photoOf(latteId), events: await eventCount() };
    const res = await upload(owner, latteId, await make(), filename, type);
    await expectNothingSaved(res, 415, message);
    expect(res.body.error.code).toBe('validation_failed');
    expect({ files: filesOnDisk(), photo: await photoOf(latteId), events: await eventCount() }).toEqual(before);
  });

  it('a file over 5 MB is 413 and nothing is saved', async () => {
    const before = { files: filesOnDisk(), photo: await photoOf(latteId), events: await eventCount() };
    const png = await (await testImage(64, 64)).png().toBuffer();
    const big = Buffer.concat([png, Buffer.alloc(5 * 1024 * 1024 + 1 - png.length)]);
    const res = await upload(owner, latteId, big, 'huge.png', 'image/png');
    await expectNothingSaved(res, 413, /larger than 5 MB; nothing was saved/);
    expect(res.body.error.code).toBe('payload_too_large');
    expect({ files: filesOnDisk(), photo: await photoOf(latteId), events: await eventCount() }).toEqual(before);
  });

  it('no file, or an item that does not exist, is refused', async () => {
    const before = filesOnDisk();
    expect((await owner.post(`/api/menu/items/${latteId}/photo`).send({ file: 'x' })).status).toBe(400);
    const png = await (await testImage(20, 20)).png().toBuffer();
    expect((await upload(owner, 999_999, png, 'x.png', 'image/png')).status).toBe(404);
    expect((await upload(owner, 0, png, 'x.png', 'image/png')).status).toBe(400);
    expect(filesOnDisk()).toEqual(before);
  });
});

describe('removing a photo', () => {
  it('clears the item and deletes its file; removing again is harmless', async () => {
    const url = (await owner.get('/api/menu')).body.items.find((i: { id: number }) => i.id === latteId).photoUrl as string;
    const events = await eventCount();
    const res = await owner.delete(`/api/menu/items/${latteId}/photo`);
    expect(res.status).toBe(200);
    expect(res.body.item).toEqual({ id: latteId, photoUrl: null });
    expect(await photoOf(latteId)).toBeNull();
    expect(filesOnDisk()).not.toContain(path.basename(url));
    expect((await served(url)).status).toBe(404);
    expect(await eventCount()).toBe(events + 1);

    expect((await owner.delete(`/api/menu/items/${latteId}/photo`)).status).toBe(200);
    expect(await eventCount()).toBe(events + 1);
    expect((await owner.delete('/api/menu/items/999999/photo')).status).toBe(404);
  });

  it('nothing but photos is served from /media', async () => {
    expect((await request(server.url).get('/media/menu/../../jugline.sqlite')).status).toBe(404);
    expect((await request(server.url).get('/media/menu/%2e%2e%2fjugline.sqlite')).status).toBe(404);
    expect((await request(server.url).get('/media/jugline.sqlite')).status).toBe(404);
  });
});
