// Where a terminal lands after a PIN switch, read off the screens table and the roles table
// (src/domain/screens.ts, src/domain/roles.ts): the same screen if the new role may open it.
import { describe, expect, it } from 'vitest';
import { HOME_SCREEN } from '@/domain/roles';
import { screenAfterSwitch } from '@/features/team/switch-target';

describe('screenAfterSwitch', () => {
  it('keeps the screen, with its query, when the new role may see it', () => {
    expect(screenAfterSwitch('/bar', 'barista')).toBe('/bar');
    expect(screenAfterSwitch('/bar', 'lead')).toBe('/bar');
    expect(screenAfterSwitch('/counter', 'cashier')).toBe('/counter');
    expect(screenAfterSwitch('/reports?from=2026-03-01', 'owner')).toBe('/reports?from=2026-03-01');
    expect(screenAfterSwitch('/receipts/41', 'cashier')).toBe('/receipts/41');
    expect(screenAfterSwitch('/pickup', 'barista')).toBe('/pickup');
  });

  it("goes to the person's home screen when the role may not", () => {
    expect(screenAfterSwitch('/counter', 'barista')).toBe(HOME_SCREEN.barista);
    expect(screenAfterSwitch('/bar', 'cashier')).toBe(HOME_SCREEN.cashier);
    expect(screenAfterSwitch('/pulse', 'barista')).toBe('/bar');
    expect(screenAfterSwitch('/admin/team', 'lead')).toBe('/pulse');
    expect(screenAfterSwitch('/receipts/41', 'barista')).toBe('/bar');
  });

  it('goes home from a path that is no screen', () => {
    expect(screenAfterSwitch('/', 'cashier')).toBe('/counter');
    expect(screenAfterSwitch('/welcome/abc', 'owner')).toBe(HOME_SCREEN.owner);
    expect(screenAfterSwitch('/receipts/', 'cashier')).toBe('/counter');
    expect(screenAfterSwitch('/bar/extra', 'barista')).toBe('/bar');
  });
});
