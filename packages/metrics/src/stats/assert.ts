/**
 * Argument checks shared by the statistics functions. Each throws a RangeError that names the
 * argument, so that a caller sees which input was wrong.
 */

function show(value: unknown): string {
  return typeof value === 'number' ? String(value) : (JSON.stringify(value) ?? String(value));
}

/** A count: a finite, non-negative integer. */
export function assertCount(value: number, name: string): void {
  if (typeof value !== 'number' || !Number.isInteger(value) || value < 0) {
    throw new RangeError(`${name} must be a non-negative integer (got ${show(value)})`);
  }
}

/** Events and trials: both counts and events ≤ n. */
export function assertEventsOfN(
  events: number,
  n: number,
  eventsName = 'events',
  nName = 'n',
): void {
  assertCount(events, eventsName);
  assertCount(n, nName);
  if (events > n) {
    throw new RangeError(`${eventsName} must not exceed ${nName} (got ${events} > ${n})`);
  }
}

/** A two-sided confidence level strictly between 0 and 1 (e.g. 0.95 or 0.998). */
export function assertConfidence(value: number, name = 'confidence'): void {
  if (typeof value !== 'number' || !(value > 0 && value < 1)) {
    throw new RangeError(`${name} must be a number in (0, 1) (got ${show(value)})`);
  }
}

/** A probability in [0, 1]. */
export function assertProbability(value: number, name: string): void {
  if (typeof value !== 'number' || !(value >= 0 && value <= 1)) {
    throw new RangeError(`${name} must be a probability in [0, 1] (got ${show(value)})`);
  }
}

/** A finite number greater than zero. */
export function assertPositive(value: number, name: string): void {
  if (typeof value !== 'number' || !Number.isFinite(value) || !(value > 0)) {
    throw new RangeError(`${name} must be a finite number > 0 (got ${show(value)})`);
  }
}

/** A finite, non-negative number. */
export function assertNonNegative(value: number, name: string): void {
  if (typeof value !== 'number' || !Number.isFinite(value) || value < 0) {
    throw new RangeError(`${name} must be a finite number ≥ 0 (got ${show(value)})`);
  }
}
