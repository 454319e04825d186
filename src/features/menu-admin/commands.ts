// The menu editor's commands. Each answers with the menu as it now is, shown at once; the
// menu.changed event brings every open Counter and Bar along.
import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { AdminMenuView, MenuAdminResult } from '@/domain/menu-admin-view';
import type { CommandSender } from '@/commands';
import { send } from '@/lib/commands';
import { menuKeys } from '@/queries/menu';
import { menuAdminKeys } from '@/queries/menu-admin';

export function useMenuCommand() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (run: (c: CommandSender) => Promise<MenuAdminResult | unknown>) => run(send),
    onSuccess: (result) => {
      const menu = (result as MenuAdminResult | undefined)?.menu;
      if (menu) qc.setQueryData<AdminMenuView>(menuAdminKeys.editable, menu);
      else qc.invalidateQueries({ queryKey: menuAdminKeys.editable });
      qc.invalidateQueries({ queryKey: menuKeys.all, exact: true });
    },
  });
}

export type MenuCommand = ReturnType<typeof useMenuCommand>;
