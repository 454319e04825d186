// Menu CSV import/export and item photos, for the owner. Uploads are multipart/form-data with one
// file in the field "file", read by multer into memory within a size limit; what the bytes are is
// decided by the services (the CSV reader, sharp), never by the file's name alone. These are plain
// routes, not commands (src/commands.ts): a multipart upload, and a CSV download.
import type { Request, Response } from 'express';
import multer from 'multer';
import { MENU_CSV_MAX_BYTES } from '@/domain/menu-csv';
import { idParam } from '@/domain/schemas';
import { userOf } from '@server/auth/guards';
import { HttpError, parse } from '@server/errors';
import type { Deps } from '@server/deps';
import { PHOTO_MAX_BYTES, removeItemPhoto, setItemPhoto } from './item-photos';
import { csvText, exportMenuCsv, importMenu, previewMenuImport } from './import';
import type { ApiRoute } from '@server/routes';
import type { CommandHandlers } from '@server/commands';

const FIELD = 'file';

/** Reads the one file of a multipart request, or answers why not (413 too large, 400 otherwise). */
function fileUpload(maxBytes: number, sizeLabel: string) {
  const middleware = multer({
    storage: multer.memoryStorage(),
    limits: { fileSize: maxBytes, files: 1, fields: 4, parts: 5, fieldSize: 1024, fieldNameSize: 100 },
  }).single(FIELD);
  return (req: Request, res: Response) =>
    new Promise<Express.Multer.File>((resolve, reject) =>
      middleware(req, res, (err?: unknown) => {
        if (err instanceof multer.MulterError && err.code === 'LIMIT_FILE_SIZE') {
          return reject(new HttpError(413, 'payload_too_large', `The file is larger than ${sizeLabel}; nothing was saved.`));
        }
        if (err) {
          const why = err instanceof multer.MulterError ? ` (${err.message.toLowerCase()})` : '';
          return reject(new HttpError(400, 'validation_failed', `The upload could not be read${why}; send one file in the field "${FIELD}".`));
        }
        if (!req.file) {
          return reject(
            new HttpError(400, 'validation_failed', `Send the file as multipart/form-data in the field "${FIELD}".`, [{ path: FIELD, message: 'Required' }]),
          );
        }
        resolve(req.file);
      }),
    );
}

/** A .csv name or a text/csv type (Windows browsers send other types for .csv files). */
function csvOf(file: Express.Multer.File): string {
  if (!/\.csv$/i.test(file.originalname) && file.mimetype !== 'text/csv') {
    throw new HttpError(415, 'validation_failed', 'Choose a .csv file (in a spreadsheet: save as "CSV UTF-8").', [{ path: FIELD, message: 'Not a CSV file' }]);
  }
  return csvText(file.buffer);
}

export function menuImportRoutes(deps: Deps, mediaDir: string): ApiRoute[] {
  const csvUpload = fileUpload(MENU_CSV_MAX_BYTES, '256 KB');
  const photoUpload = fileUpload(PHOTO_MAX_BYTES, '5 MB');
  const id = (params: unknown) => parse(idParam, params, 'params').id;
  return [
    {
      method: 'get',
      path: '/menu/export.csv',
      capability: 'editMenu',
      handler: async (req, res) => {
        const csv = await exportMenuCsv(deps.db, userOf(req).locationId);
        res.set('Content-Type', 'text/csv; charset=utf-8');
        res.set('Content-Disposition', `attachment; filename="jugline-menu-${deps.clock().toISOString().slice(0, 10)}.csv"`);
        res.set('Cache-Control', 'no-store');
        res.send(csv);
      },
    },
    {
      method: 'post',
      path: '/menu/import/preview',
      capability: 'editMenu',
      handler: async (req, res) => {
        const file = await csvUpload(req, res);
        res.json(await previewMenuImport(deps.db, userOf(req).locationId, file.originalname, csvOf(file)));
      },
    },
    {
      method: 'post',
      path: '/menu/import',
      capability: 'editMenu',
      handler: async (req, res) => {
        const file = await csvUpload(req, res);
        res.json(await importMenu(deps, userOf(req), csvOf(file)));
      },
    },
    {
      method: 'post',
      path: '/menu/items/:id/photo',
      capability: 'editMenu',
      handler: async (req, res) => {
        const itemId = id(req.params);
        const file = await photoUpload(req, res);
        res.json({ item: await setItemPhoto(deps, mediaDir, userOf(req), itemId, file.buffer) });
      },
    },
  ];
}

/** The item's photo removed: a JSON command (src/commands.ts), unlike the upload. */
export const itemPhotoCommands = (mediaDir: string): CommandHandlers<'removeItemPhoto'> => ({
  removeItemPhoto: async ({ deps, user, params }) => ({ item: await removeItemPhoto(deps, mediaDir, user, params.id) }),
});
