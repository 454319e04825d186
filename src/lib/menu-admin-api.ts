// The back-office menu editor: categories, items, sizes and recipes, milks, modifiers, import.
// Over HTTP in the browser; server/ssr/menu-admin-api.ts is the server-rendering side.
import { http } from './http';

// eslint-disable-next-line @typescript-eslint/no-empty-object-type
export interface MenuAdminApi {}

void http;
export const httpMenuAdminApi: MenuAdminApi = {};
