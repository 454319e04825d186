// What screens read, as one interface: over HTTP in the browser, straight from the services
// during server rendering (so a page render makes no network round trip).
import type { Role } from '../domain/roles';
import type { BoardSnapshot, MenuView } from '../domain/types';
import { http } from './http';

export interface PublicUser {
  id: number;
  name: string;
  role: Role;
}

export interface Api {
  session(): Promise<{ user: PublicUser | null }>;
  menu(): Promise<MenuView>;
  tickets(): Promise<BoardSnapshot>;
  pickup(): Promise<BoardSnapshot>;
}

export const httpApi: Api = {
  session: () => http('GET', '/session'),
  menu: () => http('GET', '/menu'),
  tickets: () => http('GET', '/tickets?status=board'),
  pickup: () => http('GET', '/pickup'),
};
