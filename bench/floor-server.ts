// The floor: the same work as taking an order and showing it on the screens, done with the same
// libraries used bare — node:http, one better-sqlite3 transaction inserting the same rows Jugline
// wrote for the same order (orders, order_items, payments, events) with the same pragmas, then one
// ws broadcast of the same event to every socket, serialised once. No framework, no sessions, no
// validation, no pricing: what is left is the cost of the database and the sockets themselves.
// Env: BENCH_PORT, BENCH_DATABASE_FILE (a migrated, seeded Jugline database), BENCH_TEMPLATES.
import { readFileSync } from 'node:fs';
import { createServer } from 'node:http';
import Database from 'better-sqlite3';
import { WebSocket, WebSocketServer } from 'ws';
import { serveProbe } from './probe';

/** One order as Jugline stored it, read back from Jugline's database after its run. */
export interface OrderTemplate {
  /** JSON of the request's `items`: which template a request is. Rows without their `id`. */
  key: string;
  order: Record<string, unknown>;
  items: Record<string, unknown>[];
  payments: Record<string, unknown>[];
  event: { type: string; payload: { ticket: Record<string, unknown> & { drinks: Record<string, unknown>[] } } };
  /** Jugline's answer to the POST, sent back the same size. */
  response: { order: Record<string, unknown> };
}

const templates = new Map<string, OrderTemplate>((JSON.parse(readFileSync(process.env.BENCH_TEMPLATES!, 'utf8')) as OrderTemplate[]).map((t) => [t.key, t]));

const db = new Database(process.env.BENCH_DATABASE_FILE!);
db.pragma('journal_mode = WAL');
db.pragma('synchronous = FULL');
db.pragma('foreign_keys = ON');
db.pragma('busy_timeout = 5000');

function inserter(table: string, row: Record<string, unknown>) {
  const cols = Object.keys(row); // the templates come without their ids
  const stmt = db.prepare(`insert into ${table} (${cols.join(', ')}) values (${cols.map((c) => '@' + c).join(', ')})`);
  return (values: Record<string, unknown>) => Number(stmt.run(values).lastInsertRowid);
}

const any = [...templates.values()][0];
const insertOrder = inserter('orders', any.order);
const insertItem = inserter('order_items', any.items[0]);
const insertPayment = inserter('payments', any.payments[0]);
const insertEvent = db.prepare('insert into events (location_id, type, payload, actor_id, created_at) values (?, ?, ?, ?, ?)');
let number = 0;

const take = db.transaction((t: OrderTemplate, clientOrderId: string, name: string, at: string) => {
  const orderId = insertOrder({ ...t.order, client_order_id: clientOrderId, customer_name: name, number: ++number, created_at: at, fired_at: at });
  const itemIds = t.items.map((i) => insertItem({ ...i, order_id: orderId }));
  for (const p of t.payments) insertPayment({ ...p, order_id: orderId, created_at: at, updated_at: at });
  const barIds = t.items.flatMap((i, k) => (i.station === 'bar' ? [itemIds[k]] : []));
  const ticket = {
    ...t.event.payload.ticket,
    id: orderId,
    number,
    customerName: name,
    firedAt: at,
    drinks: t.event.payload.ticket.drinks.map((d: Record<string, unknown>, k: number) => ({ ...d, id: barIds[k], ticketId: orderId })),
  };
  const seq = Number(insertEvent.run(t.order.location_id, t.event.type, JSON.stringify({ ticket }), t.order.taken_by, at).lastInsertRowid);
  return { orderId, seq, ticket };
});

const server = createServer((req, res) => {
  if (req.method !== 'POST' || req.url !== '/api/orders') {
    res.writeHead(404).end();
    return;
  }
  const chunks: Buffer[] = [];
  req.on('data', (c: Buffer) => chunks.push(c));
  req.on('end', () => {
    const body = JSON.parse(Buffer.concat(chunks).toString());
    const t = templates.get(JSON.stringify(body.items));
    if (!t) {
      res.writeHead(400).end();
      return;
    }
    const at = new Date().toISOString();
    const { orderId, seq, ticket } = take(t, body.clientOrderId, body.customerName, at);
    const message = JSON.stringify({ type: 'event', event: { seq, type: t.event.type, at, ticket } });
    for (const s of wss.clients) if (s.readyState === WebSocket.OPEN) s.send(message);
    const answer = JSON.stringify({ order: { ...t.response.order, id: orderId, number, customerName: body.customerName, clientOrderId: body.clientOrderId } });
    res.writeHead(201, { 'content-type': 'application/json; charset=utf-8' }).end(answer);
  });
});

const wss = new WebSocketServer({ server, path: '/ws', maxPayload: 4096 });
wss.on('connection', (socket) => {
  socket.on('error', () => {});
  socket.send(JSON.stringify({ type: 'hello', seq: 0 }));
});

server.listen(Number(process.env.BENCH_PORT ?? 4327), '127.0.0.1', () => {
  serveProbe(
    () =>
      new Promise<void>((resolve) => {
        for (const s of wss.clients) s.terminate();
        wss.close();
        server.close(() => {
          db.close();
          resolve();
        });
        server.closeAllConnections();
      }),
  );
  process.send?.({ ready: `http://127.0.0.1:${process.env.BENCH_PORT ?? 4327}` });
});
