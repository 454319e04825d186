// What the bar still has open at a close, and how the drawer's difference reads.
import { describe, expect, it } from 'vitest';
import { cashDifferenceWords, openTicketsAt, openTicketsWarning, openTicketsWords, ticketAgeWords } from '@/domain/shift-close';

const NOW = new Date('2026-03-02T14:13:00.000Z');

describe('open tickets at a close', () => {
  it('counts them and ages the oldest from when it was fired', () => {
    // 14:01 to 14:13 is 12 minutes = 720 s (arithmetic)
    expect(openTicketsAt(['2026-03-02T14:02:00.000Z', '2026-03-02T14:01:00.000Z'], NOW)).toEqual({ openTickets: 2, oldestWaitSeconds: 720 });
    expect(openTicketsAt([], NOW)).toEqual({ openTickets: 0, oldestWaitSeconds: null });
  });

  it('says it in words, one ticket or many', () => {
    expect(openTicketsWords({ openTickets: 2, oldestWaitSeconds: 720 })).toBe('2, the oldest waiting 12:00');
    expect(openTicketsWords({ openTickets: 0, oldestWaitSeconds: null })).toBe('none');
    expect(openTicketsWarning({ openTickets: 2, oldestWaitSeconds: 720 })).toBe('2 tickets are still open at the bar; the oldest has waited 12:00.');
    expect(openTicketsWarning({ openTickets: 1, oldestWaitSeconds: 95 })).toBe('1 ticket is still open at the bar; the ticket has waited 1:35.');
  });

  it('an age past the hour reads in hours and minutes (4200 s = 1 h 10 min, arithmetic)', () => {
    expect(ticketAgeWords(4200)).toBe('1 h 10 min');
    expect(ticketAgeWords(3599)).toBe('59:59');
  });
});

describe('the drawer difference (counted less expected; common practice: short below, over above)', () => {
  it('names short and over in the café currency', () => {
    expect(cashDifferenceWords(167_55, 166_30, 'USD')).toBe('$1.25 short');
    expect(cashDifferenceWords(100_00, 102_00, 'EUR')).toBe('€2.00 over');
    expect(cashDifferenceWords(50_00, 50_00, 'USD')).toBe('$0.00, the drawer matches');
  });
});
