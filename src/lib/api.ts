// What screens read, as one interface made from the reads in src/reads.ts: over HTTP in the
// browser (httpApi), straight from the services during server rendering (serverApi in
// server/reads.ts, so a page render makes no network round trip).
import { READ_NAMES, reads, wireOf, type Api, type ReadDef } from '@/reads';
import { http, queryString } from './http';

export type { Api };

const overHttp =
  (def: ReadDef) =>
  (input?: object): Promise<unknown> => {
    const { path, query } = wireOf(def, input);
    return http('GET', path + queryString(query), undefined, { passive: def.passive });
  };

export const httpApi = Object.fromEntries(READ_NAMES.map((name) => [name, overHttp(reads[name])])) as unknown as Api;
