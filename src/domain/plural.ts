// "1 ticket", "2 tickets", "1 person", "3 people": a count with its noun agreeing, on every screen.
// English plural rules (the screens' words are English); `shown` is the count as printed ("1,200").
const rules = new Intl.PluralRules('en-US');
export const plural = (n: number, one: string, many = `${one}s`, shown: string = String(n)) => `${shown} ${rules.select(n) === 'one' ? one : many}`;
