import { describe, expect, it } from 'vitest';
import { formatDelta, formatNumber, formatWithUnit, numberText, parseNumberText, roundTo } from '@/features/sizing/model/format';

describe('reading typed numbers', () => {
  it('when a population is typed with thousands separators, then it reads as the plain number', () => {
    expect(parseNumberText('32,000')).toBe(32_000);
    expect(parseNumberText(' 5.5 ')).toBe(5.5);
    expect(parseNumberText('.5')).toBe(0.5);
  });

  it('when a box is empty, then it reads as missing, not as zero', () => {
    expect(parseNumberText('')).toBeUndefined();
    expect(parseNumberText('   ')).toBeUndefined();
  });

  it('when a box holds words, hex or exponent notation, then it reads as not a number', () => {
    expect(parseNumberText('lots')).toBeNaN();
    expect(parseNumberText('0x10')).toBeNaN();
    expect(parseNumberText('1e3')).toBeNaN();
    expect(parseNumberText('5 mph')).toBeNaN();
  });

  it('when a stored number starts a box, then it shows without grouping or trailing zeros', () => {
    expect(numberText(32_000)).toBe('32000');
    expect(numberText(0.65 * 100)).toBe('65');
    expect(numberText(null)).toBe('');
  });
});

describe('showing figures', () => {
  it('when a figure is shown, then it carries grouping, fixed decimals and its unit', () => {
    expect(formatNumber(1234.56, 1)).toBe('1,234.6');
    expect(formatWithUnit(18.18, 1, 'ac/h')).toBe('18.2 ac/h');
  });

  it('when a limit is rounded down, then 6.29 shows as 6.2 and an exact 6.3 stays 6.3', () => {
    expect(roundTo(6.29, 1, 'down')).toBe(6.2);
    expect(roundTo(6.3, 1, 'down')).toBe(6.3);
    expect(formatWithUnit(6.29, 1, 'mph', 'down')).toBe('6.2 mph');
  });

  it('when a change is shown, then it has a sign and a unit, and a change that rounds away shows nothing', () => {
    expect(formatDelta(42.4, 0, 'ac/day')).toBe('+42 ac/day');
    expect(formatDelta(-3.46, 1, 'gpm')).toBe('−3.5 gpm');
    expect(formatDelta(0.04, 1, 'gpm')).toBeNull();
    expect(formatDelta(-0.0001, 0, 'ac')).toBeNull();
  });
});
