// Every item on the menu with its photo, by category, so photos can be added without opening
// each item. The Counter shows them on its tiles.
import { useQuery } from '@tanstack/react-query';
import { useApi } from '@/lib/api-context';
import { menuQuery } from '@/queries/menu';
import { ItemPhotoUpload } from './item-photo-upload';

export function ItemPhotos() {
  const api = useApi();
  const { data: menu, error } = useQuery(menuQuery(api));
  if (error) return <p className="text-base text-ink-600">The menu could not be loaded: {error.message}</p>;
  if (!menu) return <p className="text-base text-ink-600">Loading the menu…</p>;
  return (
    <div className="space-y-4">
      <p className="text-base text-ink-600">JPEG, PNG or WebP up to 5 MB. Photos are scaled to 800 px and saved without their camera data.</p>
      {menu.categories.map((c) => (
        <section key={c.id} aria-labelledby={`photos-cat-${c.id}`}>
          <h4 id={`photos-cat-${c.id}`} className="mb-2 text-lg font-semibold">
            {c.name}
          </h4>
          <ul className="grid grid-cols-[repeat(auto-fill,minmax(20rem,1fr))] gap-3">
            {menu.items
              .filter((i) => i.categoryId === c.id)
              .map((item) => (
                <li key={item.id} className="rounded-lg border border-steam-200 p-3">
                  <p className="mb-2 text-lg font-semibold">{item.name}</p>
                  <ItemPhotoUpload itemId={item.id} photoUrl={item.photoUrl ?? null} itemName={item.name} />
                </li>
              ))}
          </ul>
        </section>
      ))}
    </div>
  );
}
