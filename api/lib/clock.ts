/** Where the API reads the time; tests pass their own to move it forward. */
export type Clock = () => Date;

export const systemClock: Clock = () => new Date();
