/** The time source; tests pass a clock they can move forward. */
export interface Clock {
  now(): Date;
}

export const systemClock: Clock = { now: () => new Date() };
