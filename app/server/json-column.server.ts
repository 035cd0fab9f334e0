/**
 * The one place a JSON column is read. MariaDB stores JSON as LONGTEXT, so mysql2 hands back the
 * text; a driver or server with a native JSON type hands back the parsed value. Either way the
 * caller gets the value. SQL NULL stays null.
 */
export function parseJsonColumn<T = unknown>(stored: unknown): T {
  return (typeof stored === "string" ? JSON.parse(stored) : stored) as T;
}
