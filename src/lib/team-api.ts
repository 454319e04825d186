// The owner's team screen: staff accounts, roles, invitations, PINs.
// Over HTTP in the browser; server/ssr/team-api.ts is the server-rendering side.
import { http } from './http';

// eslint-disable-next-line @typescript-eslint/no-empty-object-type
export interface TeamApi {}

void http;
export const httpTeamApi: TeamApi = {};
