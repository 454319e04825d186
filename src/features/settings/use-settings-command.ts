// One settings command (a section's save, a pitcher change): its answer is the whole settings
// page, which replaces the cached one; the menu.changed event tells every other screen.
import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { SettingsPage } from '@/domain/settings-schemas';
import { menuKeys } from '@/queries/menu';
import { settingsKeys } from '@/queries/settings';

export function useSettingsCommand<T>(run: (input: T) => Promise<SettingsPage>, onSaved?: (page: SettingsPage) => void) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: run,
    onSuccess: (page) => {
      qc.setQueryData(settingsKeys.all, page);
      qc.invalidateQueries({ queryKey: menuKeys.all });
      onSaved?.(page);
    },
  });
}
