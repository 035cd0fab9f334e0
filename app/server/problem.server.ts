/** The API's one shape of a refusal: `{ "error": "what went wrong, in words" }` with its status. */
export const problem = (status: number, error: string, extra: object = {}) =>
  Response.json({ error, ...extra }, { status });
