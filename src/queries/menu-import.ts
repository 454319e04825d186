// The import panel's and the photo upload's calls. Each success refetches the menu (the live
// menu.changed event does the same for every other open screen).
import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { MenuImportCounts, MenuImportPreview } from '@/domain/menu-csv';
import { send } from '@/lib/commands';
import { menuKeys } from './menu';
import { sendFile } from '@/features/menu-import/send-file';

export const MENU_EXPORT_HREF = '/api/menu/export.csv';

/** The file as read once, so the import sends exactly the bytes the preview showed. */
export interface ChosenFile {
  name: string;
  bytes: Blob;
}

/** Nothing is saved by a preview. */
export const usePreviewImport = () =>
  useMutation({ mutationFn: (file: ChosenFile) => sendFile<MenuImportPreview>('POST', '/menu/import/preview', file.bytes, file.name) });

export function useImportMenu() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (file: ChosenFile) => sendFile<MenuImportCounts>('POST', '/menu/import', file.bytes, file.name),
    onSuccess: () => qc.invalidateQueries({ queryKey: menuKeys.all }),
  });
}

export interface ItemPhotoAnswer {
  item: { id: number; photoUrl: string | null };
}

export function useUploadPhoto(itemId: number, onProgress: (fraction: number) => void) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (file: File) => sendFile<ItemPhotoAnswer>('POST', `/menu/items/${itemId}/photo`, file, file.name, onProgress),
    onSuccess: () => qc.invalidateQueries({ queryKey: menuKeys.all }),
  });
}

export function useRemovePhoto(itemId: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (): Promise<ItemPhotoAnswer> => send.removeItemPhoto({ id: itemId }),
    onSuccess: () => qc.invalidateQueries({ queryKey: menuKeys.all }),
  });
}
