import { openDB, type DBSchema, type IDBPDatabase } from "idb";

/**
 * An IndexedDB database opened once and opened again after the browser closes the connection
 * (WebKit does under memory pressure): the next call gets a new handle, never the dead one.
 */
export function reopeningDatabase<S extends DBSchema>(
  initialName: string,
  version: number,
  upgrade: (db: IDBPDatabase<S>) => void,
) {
  let name = initialName;
  let opening: Promise<IDBPDatabase<S>> | null = null;
  return {
    open(): Promise<IDBPDatabase<S>> {
      opening ??= openDB<S>(name, version, {
        upgrade,
        terminated() {
          opening = null;
        },
      }).then((db) => {
        db.addEventListener("close", () => (opening = null));
        return db;
      });
      return opening;
    },
    /** For tests: forget the open connection (as after a crash), or switch to another device's database. */
    forget(nextName = name) {
      opening = null;
      name = nextName;
    },
  };
}
