// The menu editor's query. Its key sits under the Counter's ['menu'] on purpose: whatever
// invalidates the menu (a menu.changed event, an import) refreshes the editor too.
import { queryOptions } from '@tanstack/react-query';
import type { Api } from '@/lib/api';
import { menuKeys } from './menu';

export const menuAdminKeys = { editable: [...menuKeys.all, 'admin'] as const };

export const menuAdminQuery = (api: Api) => queryOptions({ queryKey: menuAdminKeys.editable, queryFn: () => api.menuAdmin(), staleTime: 30_000 });
