// Structured request logs (pino) with a request id. Cookies, authorisation headers and bodies are
// never logged, so passwords, session ids and card details can't end up in a log file.
import { randomUUID } from 'node:crypto';
import type { IncomingMessage } from 'node:http';
import { pino, type DestinationStream, type Logger } from 'pino';
import { pinoHttp } from 'pino-http';

export function createLogger(level: string, destination?: DestinationStream): Logger {
  return pino(
    {
      level,
      redact: {
        paths: ['req.headers.cookie', 'req.headers.authorization', 'req.headers["x-csrf-token"]', 'res.headers["set-cookie"]'],
        censor: '[hidden]',
      },
    },
    destination,
  );
}

export function requestLogger(logger: Logger) {
  return pinoHttp({
    logger,
    genReqId: (req: IncomingMessage) => (req.headers['x-request-id'] as string | undefined)?.slice(0, 64) || randomUUID(),
    // the request line and status only: no bodies, no query strings with names in them
    serializers: {
      req: (req: { id: string; method: string; url: string; headers: Record<string, unknown> }) => ({
        id: req.id,
        method: req.method,
        path: String(req.url).split('?')[0],
        headers: { cookie: req.headers.cookie, authorization: req.headers.authorization, 'user-agent': req.headers['user-agent'] },
      }),
    },
    // static files and Vite's dev modules would drown the requests that matter
    autoLogging: { ignore: (req) => /^\/(assets|@|src\/|node_modules\/|favicon)/.test(req.url ?? '') },
    customLogLevel: (_req, res, err) => (err || res.statusCode >= 500 ? 'error' : res.statusCode >= 400 ? 'warn' : 'info'),
  });
}
