// BENCHMARKS.md's blocks: what a bench run writes sits between a pair of markers, so the
// notes written by hand around them stay.
const markers = (name: string) => [`<!-- bench:${name}:start (npm run bench writes between these markers) -->`, `<!-- bench:${name}:end -->`] as const;
export const RESULTS = /<!-- bench:results (.*) -->/;

export function between(text: string, name: string): string | undefined {
  const [start, end] = markers(name);
  const a = text.indexOf(start);
  const b = text.indexOf(end);
  return a >= 0 && b > a ? text.slice(a + start.length, b) : undefined;
}

export function putBetween(text: string, name: string, body: string): string {
  const [start, end] = markers(name);
  const block = `${start}\n${body}\n${end}`;
  const a = text.indexOf(start);
  const b = text.indexOf(end);
  return a >= 0 && b > a ? text.slice(0, a) + block + text.slice(b + end.length) : `${text.trimEnd()}\n\n${block}\n`;
}
