/**
 * Period-end dates for generated samples, as ISO 8601 "YYYY-MM-DD" strings (UTC calendar).
 * daily: business days (Monday to Friday, no holiday calendar); weekly: every 7 days; monthly,
 * quarterly, annual: the last day of the month, quarter or year. The first date is the first period
 * end on or after `start`.
 */

export const frequencies = ["daily", "weekly", "monthly", "quarterly", "annual"] as const;
export type FrequencyName = (typeof frequencies)[number];

/**
 * The standard sampling frequencies: periods per year (common practice: 252 trading days, 52 weeks,
 * 12, 4, 1) and the range of the median gap between dates, in days, by which a file's frequency is
 * detected (daily covers business-day data with weekend gaps).
 */
export const frequencyTable: Readonly<
  Record<FrequencyName, { readonly periodsPerYear: number; readonly medianGapDays: readonly [number, number] }>
> = {
  daily: { periodsPerYear: 252, medianGapDays: [0.5, 4.5] },
  weekly: { periodsPerYear: 52, medianGapDays: [5, 10] },
  monthly: { periodsPerYear: 12, medianGapDays: [25, 35] },
  quarterly: { periodsPerYear: 4, medianGapDays: [80, 100] },
  annual: { periodsPerYear: 1, medianGapDays: [350, 380] },
};

/** Periods per year by frequency. */
export const periodsPerYear: Readonly<Record<FrequencyName, number>> = {
  daily: frequencyTable.daily.periodsPerYear,
  weekly: frequencyTable.weekly.periodsPerYear,
  monthly: frequencyTable.monthly.periodsPerYear,
  quarterly: frequencyTable.quarterly.periodsPerYear,
  annual: frequencyTable.annual.periodsPerYear,
};

/** Milliseconds in a day: date keys are UTC milliseconds. */
export const DAY_MS = 86_400_000;

const iso = (time: number): string => new Date(time).toISOString().slice(0, 10);

/** Last day of the month `monthIndex` (0-based, may exceed 11) of `year`, as a UTC time. */
const monthEnd = (year: number, monthIndex: number): number => Date.UTC(year, monthIndex + 1, 0);

/** `count` period-end dates from `start` ("YYYY-MM-DD"). */
export function periodDates(frequency: FrequencyName, start: string, count: number): string[] {
  const startTime = Date.parse(`${start}T00:00:00Z`);
  const first = new Date(startTime);
  const dates: string[] = [];
  if (frequency === "daily" || frequency === "weekly") {
    let time = startTime;
    while (frequency === "daily" && isWeekend(time)) time += DAY_MS;
    while (dates.length < count) {
      dates.push(iso(time));
      time += frequency === "weekly" ? 7 * DAY_MS : DAY_MS;
      while (frequency === "daily" && isWeekend(time)) time += DAY_MS;
    }
    return dates;
  }
  const step = frequency === "monthly" ? 1 : frequency === "quarterly" ? 3 : 12;
  // First period end on or after start: months ending a quarter are 2, 5, 8, 11; years end in 11.
  let month = first.getUTCMonth();
  if (step > 1) month = month + ((step - 1 - (month % step)) % step);
  for (let k = 0; dates.length < count; k++) dates.push(iso(monthEnd(first.getUTCFullYear(), month + k * step)));
  return dates;
}

function isWeekend(time: number): boolean {
  const day = new Date(time).getUTCDay();
  return day === 0 || day === 6;
}
