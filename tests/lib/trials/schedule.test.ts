import { describe, expect, it } from 'vitest';
import { isCheckInDue, nextCheckInDue } from '@/lib/trials/schedule';

describe('check-in schedule', () => {
  it('is due at start + k × schedule, the first such date after the last check-in', () => {
    expect(nextCheckInDue('2026-10-01', 7, null)).toBe('2026-10-08');
    expect(nextCheckInDue('2026-10-01', 7, '2026-10-01')).toBe('2026-10-08');
    expect(nextCheckInDue('2026-10-01', 7, '2026-10-07')).toBe('2026-10-08');
    // A check-in on the due date itself moves the next one a full period on.
    expect(nextCheckInDue('2026-10-01', 7, '2026-10-08')).toBe('2026-10-15');
    // Missed periods: the next due date is the first one after the last check-in, not today.
    expect(nextCheckInDue('2026-10-01', 14, '2026-10-03')).toBe('2026-10-15');
    // Across a month and a leap day.
    expect(nextCheckInDue('2028-02-20', 10, null)).toBe('2028-03-01');
    expect(nextCheckInDue('2026-12-28', 7, '2027-01-02')).toBe('2027-01-04');
  });

  it('compares calendar dates', () => {
    expect(isCheckInDue('2026-10-08', '2026-10-08')).toBe(true);
    expect(isCheckInDue('2026-10-09', '2026-10-08')).toBe(false);
  });

  it('refuses a schedule below one day', () => {
    expect(() => nextCheckInDue('2026-10-01', 0, null)).toThrow(RangeError);
  });
});
