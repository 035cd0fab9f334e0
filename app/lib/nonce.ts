import { createContext, useContext } from "react";

/**
 * The Content-Security-Policy nonce of the page being rendered on the server. In the browser it
 * is empty: browsers hide the attribute, and scripts added after load need none.
 */
export const NonceContext = createContext("");
export const useNonce = () => useContext(NonceContext);
