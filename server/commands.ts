// The server's side of every command in src/commands.ts: each area keeps its handlers in its own
// folder (typed here against the table, so a missing or mistyped one fails the typecheck), and
// commandRoutes makes the routes from them — the method, path and capability of the definition
// (mountRoutes puts the capability's guard first), the params and then the body parsed with the
// definition's schemas, and the answer sent with its status.
import type { Request, RequestHandler, Response } from 'express';
import type { z } from 'zod';
import type { SessionUser } from '@/domain/types';
import { COMMAND_NAMES, commands, type CommandDef, type CommandName, type CommandOutput, type Commands, type ParsedBody, type ParsedParams } from '@/commands';
import type { Deps } from './deps';
import { parse } from './errors';
import type { ApiRoute } from './routes';

/** What a handler is given: who is asking (a command open to everyone may come signed out) and the params as parsed. */
export interface CommandContext<C> {
  deps: Deps;
  user: C extends { capability: null } ? SessionUser | undefined : SessionUser;
  params: ParsedParams<C>;
  /** For the few that need the request itself: the session (a switch, a welcome link), its
   * origin (links in mail), rate-limit marks and headers (`res.locals.wrongSecret`, `Retry-After`). */
  req: Request;
  res: Response;
  /** Answer with another status than the definition's (an order already taken: 200, not 201). */
  status(code: number): void;
}
type Handle<C> = (ctx: CommandContext<C>, body: ParsedBody<C>) => Promise<CommandOutput<C>>;
/** A handler, or one with middleware that runs before the guard (a rate limit). */
export type CommandHandler<C> = Handle<C> | { before: RequestHandler[]; handle: Handle<C> };

/** The handlers of some commands: `CommandHandlers<'createLot' | 'retireLot'>`. */
export type CommandHandlers<K extends CommandName = CommandName> = { [N in K]: CommandHandler<Commands[N]> };
/** A command the server may be started without: null leaves its route out (the receipt, with no mail server). */
type Optional = 'mailReceipt';
/** Every command's handler, as the app mounts them. */
export type AllCommandHandlers = { [N in CommandName]: CommandHandler<Commands[N]> | (N extends Optional ? null : never) };

type AnyHandle = (ctx: CommandContext<CommandDef>, body: unknown) => Promise<unknown>;

async function parsed(schema: (() => Promise<z.ZodType>) | undefined, value: unknown, where?: string): Promise<unknown> {
  return schema ? parse(await schema(), value, where) : undefined;
}

/** The route of every command; mountRoutes puts the capability's guard before each. */
export function commandRoutes(deps: Deps, handlers: AllCommandHandlers): ApiRoute[] {
  const routes: ApiRoute[] = [];
  for (const name of COMMAND_NAMES) {
    const given = handlers[name] as CommandHandler<CommandDef> | null;
    if (!given) continue;
    const def: CommandDef = commands[name];
    const handle = (typeof given === 'function' ? given : given.handle) as AnyHandle;
    routes.push({
      method: def.method,
      path: def.path,
      capability: def.capability,
      before: typeof given === 'function' ? undefined : given.before,
      handler: async (req, res) => {
        const params = await parsed(def.params, req.params, 'params');
        const body = await parsed(def.body, req.body);
        let status: number = def.status ?? 200;
        const ctx = { deps, user: req.user, params, req, res, status: (code: number) => (status = code) };
        const answer = await handle(ctx as CommandContext<CommandDef>, body);
        if (status === 204) res.status(204).end();
        else res.status(status).json(answer);
      },
    });
  }
  return routes;
}
