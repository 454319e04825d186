// A menu item's photo: choose a file, watch it upload (bar and percentage), see the result.
// The server decides what the bytes are and re-encodes them; the checks here only save a wasted
// upload. The local preview is a data: URL, which the page's Content-Security-Policy allows.
import { useEffect, useId, useState, type ChangeEvent } from 'react';
import { buttonStyles } from '@/components/ui/button';
import { FieldError } from '@/components/ui/field-error';
import { cn } from '@/lib/cn';
import { useRemovePhoto, useUploadPhoto } from '@/queries/menu-import';

/** server/menu/item-photos.ts PHOTO_MAX_BYTES */
const MAX_BYTES = 5 * 1024 * 1024;
const TYPES = ['image/jpeg', 'image/png', 'image/webp'];
/** The hidden file input's focus, drawn on the label that stands for it. */
export const FOCUS_RING =
  'peer-focus-visible:outline-3 peer-focus-visible:outline-offset-2 peer-focus-visible:outline-copper-500 peer-focus-visible:outline-solid';

function readAsDataUrl(file: File): Promise<string> {
  return new Promise((resolve, reject) => {
    const reader = new FileReader();
    reader.onload = () => resolve(String(reader.result));
    reader.onerror = () => reject(reader.error);
    reader.readAsDataURL(file);
  });
}

export function ItemPhotoUpload({ itemId, photoUrl, itemName = 'this item' }: { itemId: number; photoUrl: string | null; itemName?: string }) {
  const inputId = useId();
  const errorId = useId();
  const [current, setCurrent] = useState(photoUrl);
  const [localPreview, setLocalPreview] = useState<string | null>(null);
  const [progress, setProgress] = useState<number | null>(null);
  const [error, setError] = useState<string | undefined>();
  const upload = useUploadPhoto(itemId, setProgress);
  const remove = useRemovePhoto(itemId);
  useEffect(() => setCurrent(photoUrl), [photoUrl]);

  async function choose(e: ChangeEvent<HTMLInputElement>) {
    const file = e.target.files?.[0];
    e.target.value = '';
    if (!file) return;
    setError(undefined);
    if (file.type && !TYPES.includes(file.type)) return setError(`${file.name} is not a JPEG, PNG or WebP photo.`);
    if (file.size > MAX_BYTES) return setError(`${file.name} is larger than 5 MB; choose a smaller photo.`);
    setLocalPreview(await readAsDataUrl(file).catch(() => null));
    setProgress(0);
    upload.mutate(file, {
      onSuccess: ({ item }) => setCurrent(item.photoUrl),
      onError: (err) => setError(err.message),
      onSettled: () => {
        setProgress(null);
        setLocalPreview(null);
      },
    });
  }

  const shown = localPreview ?? current;
  const pct = progress === null ? null : Math.round(progress * 100);
  const busy = upload.isPending || remove.isPending;

  return (
    <div className="flex items-start gap-3" data-testid={`photo-${itemId}`}>
      <div className="flex h-24 w-24 shrink-0 items-center justify-center overflow-hidden rounded-lg border border-steam-200 bg-steam-100">
        {shown ? (
          <img src={shown} alt={`Photo of ${itemName}`} className={cn('h-full w-full object-cover', localPreview && 'opacity-70')} />
        ) : (
          <span className="px-1 text-center text-sm text-ink-600">No photo</span>
        )}
      </div>
      <div className="min-w-0 flex-1 space-y-2">
        <div className="flex flex-wrap gap-2">
          <input
            id={inputId}
            type="file"
            accept="image/jpeg,image/png,image/webp"
            aria-label={`Photo for ${itemName}`}
            aria-describedby={error ? errorId : undefined}
            className="peer sr-only"
            disabled={busy}
            onChange={choose}
          />
          <label htmlFor={inputId} className={cn(buttonStyles({ tone: 'quiet' }), FOCUS_RING, 'cursor-pointer', busy && 'pointer-events-none opacity-50')}>
            {current ? 'Replace photo' : 'Add photo'}
          </label>
          {current && !busy && (
            <button
              type="button"
              className={buttonStyles({ tone: 'quiet' })}
              onClick={() => remove.mutate(undefined, { onSuccess: () => setCurrent(null), onError: (err) => setError(err.message) })}
            >
              Remove
            </button>
          )}
        </div>
        {pct !== null && (
          <div className="flex items-center gap-2">
            <div
              role="progressbar"
              aria-label={`Uploading the photo of ${itemName}`}
              aria-valuemin={0}
              aria-valuemax={100}
              aria-valuenow={pct}
              className="h-3 flex-1 overflow-hidden rounded-full bg-steam-200"
            >
              <div className="h-full bg-copper-700" style={{ width: `${pct}%` }} />
            </div>
            <span className="w-28 text-sm text-ink-900 tabular-nums" aria-live="polite">
              {pct < 100 ? `${pct}% sent` : 'Processing…'}
            </span>
          </div>
        )}
        <FieldError id={errorId} message={error} />
      </div>
    </div>
  );
}
