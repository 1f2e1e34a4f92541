/** Where the alert engine reads the time; tests pass a clock they move by hand. */
export interface Clock {
  now(): Date;
}

export const systemClock: Clock = { now: () => new Date() };
