/**
 * What the routes learn about a request that its log line and its final status need. The HTTP
 * layer gives every request an id header (overwriting any the client sent); code deeper in notes
 * facts against that id, and the HTTP layer takes them once the route has answered.
 */
export const REQUEST_ID_HEADER = "x-sternpost-request-id";

interface Notes {
  userId?: number;
  /** The route failed to read a body that was not what it claimed (a broken form): a 400, not a 500. */
  unreadableBody?: boolean;
}

const notes = new Map<string, Notes>();

function note(request: Request, facts: Notes) {
  const id = request.headers.get(REQUEST_ID_HEADER);
  if (id) notes.set(id, { ...notes.get(id), ...facts });
}

export const noteUser = (request: Request, userId: number) => note(request, { userId });
export const noteUnreadableBody = (request: Request) => note(request, { unreadableBody: true });

/** The notes of a finished request, forgotten as they are read. */
export function takeNotes(requestId: string): Notes {
  const found = notes.get(requestId) ?? {};
  notes.delete(requestId);
  return found;
}
