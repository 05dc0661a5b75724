// Maps times in seconds onto record indices. Times written in decimal seconds rarely divide the
// record interval exactly in binary (0.3 / 0.1 = 2.9999999999999996), so a time within a
// billionth of a record of a record time counts as falling on it; otherwise switches written as
// "every 0.3 s" would land one record late at random.

export const RECORD_TIME_TOLERANCE = 1e-9;

/** Index of the first record whose time t * recordIntervalS is at or after timeS (never below 0). */
export function recordIndexAtOrAfter(timeS: number, recordIntervalS: number): number {
  return Math.max(0, Math.ceil(timeS / recordIntervalS - RECORD_TIME_TOLERANCE));
}
