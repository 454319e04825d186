// The request schemas of src/domain, named by module and name for the catalogues of reads
// (src/reads.ts) and commands (src/commands.ts). Only the server parses a request, so a schema is
// loaded when first used: the browser needs the paths alone, and would otherwise bring zod into
// every screen's first load.
export const schemas = () => import('@/domain/schemas');
export const teamSchemas = () => import('@/domain/team-schemas');
export const cardCheckSchemas = () => import('@/domain/card-check-schemas');
export const waitNowSchemas = () => import('@/domain/wait-now');
export const beansSchemas = () => import('@/domain/beans-schemas');
export const settingsSchemas = () => import('@/domain/settings-schemas');
export const menuAdminSchemas = () => import('@/domain/menu-admin-schemas');

/** `schema(schemas, 'idParam')`: a schema from src/domain, by its module and name. */
export const schema =
  <M, K extends keyof M>(load: () => Promise<M>, name: K) =>
  async (): Promise<M[K]> =>
    (await load())[name];
