import { dayNumber } from '@/lib/evidence/normalise';

function dateOfDay(day: number): string {
  return new Date(day * 86_400_000).toISOString().slice(0, 10);
}

/**
 * The next check-in date of a trial: the first date start + k × every (k ≥ 1)
 * that falls after the last check-in (or after the start when there is none).
 * All dates are calendar dates `YYYY-MM-DD`. Throws RangeError on bad dates or
 * a schedule below one day.
 */
export function nextCheckInDue(startDate: string, everyDays: number, lastCheckIn: string | null): string {
  if (!Number.isInteger(everyDays) || everyDays < 1) throw new RangeError(`check-in schedule must be a whole number of days ≥ 1, got ${everyDays}`);
  const start = dayNumber(startDate);
  const after = lastCheckIn ? Math.max(dayNumber(lastCheckIn), start) : start;
  const k = Math.floor((after - start) / everyDays) + 1;
  return dateOfDay(start + k * everyDays);
}

/** True when a check-in dated `due` is due on `today` (both `YYYY-MM-DD`). */
export function isCheckInDue(due: string, today: string): boolean {
  return due <= today;
}

/** Today's calendar date in UTC for an instant. */
export function utcDate(now: Date): string {
  return now.toISOString().slice(0, 10);
}
