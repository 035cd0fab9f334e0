/**
 * A submission for review travels as an ordinary operation on this reserved item key, so it
 * queues offline behind the entries it follows and reaches the server after them.
 */
export const SUBMIT_KEY = "@submit";
export const submitValue = { action: "submit" } as const;
