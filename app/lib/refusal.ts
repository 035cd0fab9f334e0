/**
 * The one way a server step says no: a reason from a short list, each with its HTTP status, and
 * a message worded for the person who asked. Pages show the message; the API sends it as a
 * problem. A request in the wrong state (already submitted, locked, a draft that is not one) is
 * 409 everywhere.
 */
export const refusalStatus = {
  invalid: 400,
  forbidden: 403,
  "not-found": 404,
  "wrong-state": 409,
  "too-large": 413,
  "unsupported-type": 415,
  "store-missing": 502,
} as const;

export type RefusalReason = keyof typeof refusalStatus;

export class Refusal extends Error {
  readonly status: (typeof refusalStatus)[RefusalReason];
  constructor(
    readonly reason: RefusalReason,
    message: string,
    /** The form field the message belongs to, when there is one. */
    readonly field?: string,
  ) {
    super(message);
    this.name = "Refusal";
    this.status = refusalStatus[reason];
  }
}
