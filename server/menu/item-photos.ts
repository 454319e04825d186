// Item photos: what the owner uploads is only trusted once sharp has read it as a JPEG, PNG or
// WebP from its own bytes (never by its name or the browser's type). It is then turned upright,
// scaled to fit 800 × 800 px and written anew as WebP, which also drops its metadata (camera,
// place). Stored under the media folder with a random name; the old file goes once the new one
// is in the database.
import { randomBytes } from 'node:crypto';
import { mkdir, unlink, writeFile } from 'node:fs/promises';
import path from 'node:path';
import sharp from 'sharp';
import type { SessionUser } from '@/domain/types';
import { notFound, unsupported } from '@server/domain-errors';
import type { Deps } from '@server/deps';
import { appendMenuChangedEvent, runCommand } from '@server/events';
import type { Db } from '@server/db/knex';

export const PHOTO_MAX_BYTES = 5 * 1024 * 1024;
export const PHOTO_MAX_PX = 800;
const FORMATS = ['jpeg', 'png', 'webp'];
/** A decompression bomb stops here: 40 megapixels is more than any phone photo. */
const MAX_INPUT_PIXELS = 40_000_000;
/** Photos live in <media>/menu and are served at /media/menu/<name>. */
export const PHOTO_FOLDER = 'menu';
const NAME = /^[0-9a-f]{32}\.webp$/;

export const photoUrlOf = (photo: string | null | undefined): string | null => (photo && NAME.test(photo) ? `/media/${PHOTO_FOLDER}/${photo}` : null);

const notAnImage = (what: string) => unsupported(`${what} Choose a JPEG, PNG or WebP photo.`, [{ path: 'file', message: 'Not a JPEG, PNG or WebP image' }]);

/** The upload as a WebP of at most 800 px a side, or 415 when its bytes are not a photo we take. */
export async function toMenuPhoto(bytes: Buffer): Promise<Buffer> {
  const options = { failOn: 'error' as const, limitInputPixels: MAX_INPUT_PIXELS };
  let format: string | undefined;
  try {
    format = (await sharp(bytes, options).metadata()).format;
  } catch {
    throw notAnImage('That file is not an image.');
  }
  if (!format || !FORMATS.includes(format)) throw notAnImage(`That file is ${format ? `a ${format.toUpperCase()} image` : 'not an image we can read'}.`);
  try {
    return await sharp(bytes, options)
      .autoOrient()
      .resize({ width: PHOTO_MAX_PX, height: PHOTO_MAX_PX, fit: 'inside', withoutEnlargement: true })
      .webp({ quality: 82 })
      .toBuffer();
  } catch {
    throw notAnImage('That image could not be read (it may be cut short or too large).');
  }
}

async function itemInLocation(db: Db, locationId: number, itemId: number) {
  const item = await db('menu_items')
    .join('menu_categories', 'menu_categories.id', 'menu_items.category_id')
    .where({ 'menu_items.id': itemId, 'menu_categories.location_id': locationId })
    .first('menu_items.id', 'menu_items.photo');
  if (!item) throw notFound('Menu item');
  return item as { id: number; photo: string | null };
}

async function removeFile(mediaDir: string, photo: string | null) {
  if (!photo || !NAME.test(photo)) return;
  await unlink(path.join(mediaDir, PHOTO_FOLDER, photo)).catch((e: NodeJS.ErrnoException) => {
    if (e.code !== 'ENOENT') throw e;
  });
}

export interface ItemPhoto {
  id: number;
  photoUrl: string | null;
}

export async function setItemPhoto(deps: Deps, mediaDir: string, user: SessionUser, itemId: number, upload: Buffer): Promise<ItemPhoto> {
  await itemInLocation(deps.db, user.locationId, itemId);
  const webp = await toMenuPhoto(upload);
  const name = `${randomBytes(16).toString('hex')}.webp`;
  await mkdir(path.join(mediaDir, PHOTO_FOLDER), { recursive: true });
  await writeFile(path.join(mediaDir, PHOTO_FOLDER, name), webp, { flag: 'wx' });
  let old: string | null;
  try {
    old = await runCommand(deps, async (trx) => {
      const item = await itemInLocation(trx, user.locationId, itemId);
      await trx('menu_items').where({ id: itemId }).update({ photo: name });
      return { result: item.photo, events: [await appendMenuChangedEvent(trx, user.locationId, deps.clock().toISOString(), user.id)] };
    });
  } catch (err) {
    await removeFile(mediaDir, name);
    throw err;
  }
  await removeFile(mediaDir, old);
  return { id: itemId, photoUrl: photoUrlOf(name) };
}

export async function removeItemPhoto(deps: Deps, mediaDir: string, user: SessionUser, itemId: number): Promise<ItemPhoto> {
  const old = await runCommand(deps, async (trx) => {
    const item = await itemInLocation(trx, user.locationId, itemId);
    if (!item.photo) return { result: null, events: [] };
    await trx('menu_items').where({ id: itemId }).update({ photo: null });
    return { result: item.photo, events: [await appendMenuChangedEvent(trx, user.locationId, deps.clock().toISOString(), user.id)] };
  });
  await removeFile(mediaDir, old);
  return { id: itemId, photoUrl: null };
}
