// The owner's team screen: staff accounts, roles, invitations, PINs; the welcome page; the
// people a terminal can switch to. Over HTTP in the browser; server/ssr/team-api.ts is the
// server-rendering side. Commands go through src/features/team/commands.ts.
import type { SwitchPerson, TeamView, WelcomeView } from '@/domain/team-schemas';
import { http } from './http';

export interface TeamApi {
  list(): Promise<TeamView>;
  /** Who an invitation or reset link is for; 404 when it can't be used. */
  welcome(token: string): Promise<WelcomeView>;
  switchPeople(): Promise<{ people: SwitchPerson[] }>;
}

export const httpTeamApi: TeamApi = {
  list: () => http('GET', '/team'),
  welcome: (token) => http('GET', `/welcome/${encodeURIComponent(token)}`),
  switchPeople: () => http('GET', '/switch/people'),
};
