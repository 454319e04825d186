// Lists and search in the local payment fake (server/fakes/payment-fake.ts), in the provider's v1
// shapes: a list is { object: 'list', data, has_more, url }, newest first, paged with limit /
// starting_after / ending_before and filtered by a `created` range; a search is
// { object: 'search_result', data, has_more, next_page, url }, paged with `page`. Search
// understands a small part of the provider's query language: `metadata['key']:'value'` and
// `status:'value'` clauses joined by AND.
import { allowOnly, invalid, missing, str, type Form, type Obj } from './payment-fake-cards';

const MAX_LIMIT = 100;

function limitOf(p: Form): number {
  const v = str(p, 'limit');
  if (v === undefined) return 10;
  const n = Number(v);
  if (!/^\d+$/.test(v) || n < 1 || n > MAX_LIMIT)
    throw invalid('This value must be greater than or equal to 1 and less than or equal to 100.', { param: 'limit' });
  return n;
}

function unixTime(v: string, param: string): number {
  if (!/^\d{1,12}$/.test(v)) throw invalid(`Invalid integer: ${v}`, { param, code: 'parameter_invalid_integer' });
  return Number(v);
}

/** `created=<t>` or `created[gt|gte|lt|lte]=<t>` as a test on an object's `created`. */
function createdFilter(p: Form): (o: Obj) => boolean {
  const c = p.created;
  if (c === undefined) return () => true;
  if (typeof c === 'string') {
    const t = unixTime(c, 'created');
    return (o) => o.created === t;
  }
  const bounds: [string, (a: number, b: number) => boolean][] = [
    ['gt', (a, b) => a > b],
    ['gte', (a, b) => a >= b],
    ['lt', (a, b) => a < b],
    ['lte', (a, b) => a <= b],
  ];
  const tests: ((o: Obj) => boolean)[] = [];
  for (const [key, value] of Object.entries(c)) {
    const bound = bounds.find(([k]) => k === key);
    if (!bound || typeof value !== 'string') throw invalid(`Received unknown parameter: created[${key}]`, { param: `created[${key}]` });
    const t = unixTime(value, `created[${key}]`);
    tests.push((o) => bound[1](o.created as number, t));
  }
  return (o) => tests.every((t) => t(o));
}

/**
 * One page of `objects` (oldest first, as stored), after the `created` range and `match`.
 * `extra` names the filters this list takes besides the paging ones.
 */
export function listPage(url: string, objects: Iterable<Obj>, p: Form, extra: string[], match: (o: Obj) => boolean = () => true): Obj {
  allowOnly(p, ['limit', 'starting_after', 'ending_before', 'created', 'expand', ...extra]);
  const limit = limitOf(p);
  const inRange = createdFilter(p);
  const all = [...objects].reverse().filter((o) => inRange(o) && match(o)); // newest first
  const after = str(p, 'starting_after');
  const before = str(p, 'ending_before');
  const position = (id: string, param: string) => {
    const i = all.findIndex((o) => o.id === id);
    if (i < 0) throw missing('object', id, param);
    return i;
  };
  let data: Obj[];
  let hasMore: boolean;
  if (before !== undefined) {
    const end = position(before, 'ending_before');
    data = all.slice(Math.max(0, end - limit), end);
    hasMore = end - limit > 0;
  } else {
    const start = after === undefined ? 0 : position(after, 'starting_after') + 1;
    data = all.slice(start, start + limit);
    hasMore = start + limit < all.length;
  }
  return { object: 'list', url, has_more: hasMore, data };
}

type Clause = (o: Obj) => boolean;

function clause(text: string): Clause {
  const meta = /^metadata\[(['"])([^'"]+)\1\]:(['"])(.*)\3$/.exec(text);
  if (meta) {
    const [, , key, , value] = meta;
    return (o) => (o.metadata as Record<string, string> | undefined)?.[key] === value;
  }
  const field = /^(status|currency):(['"])(.*)\2$/.exec(text);
  if (field) {
    const [, name, , value] = field;
    return (o) => o[name] === value;
  }
  throw invalid(`The payment fake's search understands metadata['key']:'value' and status:'value' clauses joined by AND, not: ${text}`, { param: 'query' });
}

/** One page of a search over `objects` (oldest first, as stored). */
export function searchPage(url: string, objects: Iterable<Obj>, p: Form): Obj {
  allowOnly(p, ['query', 'limit', 'page', 'expand']);
  const query = str(p, 'query');
  if (!query) throw invalid('Missing required param: query.', { param: 'query', code: 'parameter_missing' });
  const clauses = query
    .trim()
    .split(/\s+AND\s+/)
    .map(clause);
  const limit = limitOf(p);
  const page = str(p, 'page');
  const start = page === undefined ? 0 : Number(/^offset:(\d+)$/.exec(page)?.[1] ?? NaN);
  if (!Number.isInteger(start)) throw invalid(`Invalid page: ${page}`, { param: 'page' });
  const all = [...objects].reverse().filter((o) => clauses.every((c) => c(o)));
  const data = all.slice(start, start + limit);
  const hasMore = start + limit < all.length;
  return { object: 'search_result', url, has_more: hasMore, next_page: hasMore ? `offset:${start + limit}` : null, data };
}
