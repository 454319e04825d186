// Counts agree with their nouns (English grammar, common practice).
import { describe, expect, it } from 'vitest';
import { plural } from '@/domain/plural';

describe('plural', () => {
  it('one takes the singular, every other count the plural', () => {
    expect(plural(1, 'ticket')).toBe('1 ticket');
    expect(plural(0, 'ticket')).toBe('0 tickets');
    expect(plural(2, 'person', 'people')).toBe('2 people');
    expect(plural(1, 'person', 'people')).toBe('1 person');
    expect(plural(1200, 'ticket', undefined, '1,200')).toBe('1,200 tickets');
  });
});
