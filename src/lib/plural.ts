// "1 ticket", "2 tickets", "1 person", "3 people": a count with its noun agreeing, on every screen.
export const plural = (n: number, one: string, many = `${one}s`, shown: string = String(n)) => `${shown} ${n === 1 ? one : many}`;
