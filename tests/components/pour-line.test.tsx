// The pour line never tells lateness by colour alone: past target it hatches and the text says so.
import { render, screen } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { PourLine, ageLabel } from '@/features/bar/pour-line';

describe('ageLabel', () => {
  it('writes the age as it is (m:ss), and how late past target', () => {
    // hand-worked: 59 s is 0:59, not "0 min"; 10 s past a 4:00 target is +0:10, not "+1 min"
    expect(ageLabel(59, 240)).toBe('0:59');
    expect(ageLabel(180, 240)).toBe('3:00');
    expect(ageLabel(240, 240)).toBe('4:00');
    expect(ageLabel(250, 240)).toBe('+0:10 late'); // any time past target reads late
    expect(ageLabel(240 + 150, 240)).toBe('+2:30 late');
  });
});

describe('PourLine', () => {
  it('fills toward the target before it', () => {
    render(<PourLine ageSeconds={120} targetSeconds={240} />);
    const meter = screen.getByRole('meter');
    expect(meter).toHaveAttribute('aria-valuetext', '2:00');
    const fill = meter.firstElementChild as HTMLElement;
    expect(fill.style.width).toBe('50%');
    expect(fill).not.toHaveClass('pour-hatch');
  });
  it('hatches past the target', () => {
    render(<PourLine ageSeconds={400} targetSeconds={240} />);
    const meter = screen.getByRole('meter');
    expect(meter).toHaveAttribute('aria-valuetext', '+2:40 late');
    expect(meter.firstElementChild).toHaveClass('pour-hatch');
  });
});
