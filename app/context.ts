// What the production server hands every loader and action.
declare module "react-router" {
  interface AppLoadContext {
    /** The client's address as the server saw it (behind a proxy: the forwarded one). */
    clientAddress?: string;
    /** This response's Content-Security-Policy nonce, for React Router's inline scripts. */
    cspNonce?: string;
  }
}
export {};
