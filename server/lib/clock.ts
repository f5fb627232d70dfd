/** Time source; tests swap it to move past expiry without waiting. */
export interface Clock {
  now(): Date;
}
export const systemClock: Clock = { now: () => new Date() };
