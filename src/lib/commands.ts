// The browser's sender of every command in src/commands.ts, over the same `http()` as the reads
// (its 401, offline and error handling): `send.refundOrder({ id, reason })` posts `{ reason }` to
// /orders/12/refund. Commands run in the browser only: server rendering never changes anything.
import { COMMAND_NAMES, commands, wireOfCommand, type CommandDef, type CommandSender } from '@/commands';
import { http } from './http';

const overHttp =
  (def: CommandDef) =>
  (input: object = {}): Promise<unknown> => {
    const { path, body } = wireOfCommand(def, input);
    return http(def.method.toUpperCase(), path, body, { passive: def.passive });
  };

export const send = Object.fromEntries(COMMAND_NAMES.map((name) => [name, overHttp(commands[name])])) as unknown as CommandSender;
