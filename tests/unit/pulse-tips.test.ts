// Pulse shows today's tips while the café takes them, or when some came today anyway (tips turned
// off after the morning's); a café without tips sees no row of zeros.
import { describe, expect, it } from 'vitest';
import { pulseTips } from '@/domain/pulse';

const none = { cents: 0, cashCents: 0, cardCents: 0 };
const some = { cents: 2_40, cashCents: 1_00, cardCents: 1_40 };

describe('pulseTips', () => {
  it('shows them while tips are on, zeros included', () => {
    expect(pulseTips(true, none)).toEqual(none);
    expect(pulseTips(true, some)).toEqual(some);
  });

  it('with tips off: shown only when there are some today', () => {
    expect(pulseTips(false, none)).toBeNull();
    expect(pulseTips(false, some)).toEqual(some);
  });
});
