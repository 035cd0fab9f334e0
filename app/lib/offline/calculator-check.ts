/**
 * The calculators' client loader: ask the server whether this person may use them when there is
 * a connection; with none, the check was made when the page was first loaded, so carry on with
 * no data (the arithmetic runs on the tablet). A refusal from the server is still a refusal.
 */
export async function checkWhenOnline(serverLoader: () => Promise<unknown>): Promise<null> {
  try {
    await serverLoader();
    return null;
  } catch (error) {
    if (error instanceof Response) throw error;
    return null;
  }
}
