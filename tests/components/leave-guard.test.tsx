// A half-built order on the Counter must not vanish on a stray "Sign out": the staff menu asks
// first while a screen holds unsent work, and asks nothing otherwise.
import { renderHook } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { confirmLeave, useLeaveGuard } from '@/lib/leave-guard';

afterEach(() => vi.restoreAllMocks());

describe('the leave guard', () => {
  it('lets the person go without asking when nothing would be lost', () => {
    const ask = vi.spyOn(window, 'confirm');
    renderHook(() => useLeaveGuard(null));
    expect(confirmLeave()).toBe(true);
    expect(ask).not.toHaveBeenCalled();
  });

  it('asks with the screen’s words while work is held, and follows the answer', () => {
    const ask = vi.spyOn(window, 'confirm').mockReturnValueOnce(false).mockReturnValueOnce(true);
    const { rerender, unmount } = renderHook(({ m }) => useLeaveGuard(m), {
      initialProps: { m: 'The order being built (2 items) will be lost.' as string | null },
    });
    expect(confirmLeave()).toBe(false);
    expect(ask).toHaveBeenCalledWith('The order being built (2 items) will be lost. Leave anyway?');
    expect(confirmLeave()).toBe(true);
    rerender({ m: null }); // sent: nothing left to lose
    expect(confirmLeave()).toBe(true);
    expect(ask).toHaveBeenCalledTimes(2);
    rerender({ m: 'Again.' });
    unmount(); // the Counter left the page: its guard goes with it
    expect(confirmLeave()).toBe(true);
  });
});
