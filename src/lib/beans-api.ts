// Bean lots with their freshness and stock, and the dial-in log.
// Over HTTP in the browser; server/ssr/beans-api.ts is the server-rendering side.
import { http } from './http';

// eslint-disable-next-line @typescript-eslint/no-empty-object-type
export interface BeansApi {}

void http;
export const httpBeansApi: BeansApi = {};
