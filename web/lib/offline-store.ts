/*
 * The one place this browser keeps work that is not on the server yet (a visit report written
 * without a connection, photos waiting to upload), in IndexedDB through idb-keyval, so it survives
 * a reload, a closed tab and a phone that restarts. Keys are the callers' own, prefixed by kind
 * (e.g. `visit-draft:<id>`), so `localKeys` can list one kind.
 */
import { createStore, del, get, keys, set } from 'idb-keyval';

// idb-keyval's createStore only creates its store when it first creates the database, so this
// database holds this one store: another kind of data gets a key prefix here, not a second store.
const pending = createStore('brinewatch', 'pending');

/**
 * Values are kept as structured clones, so Blobs and Files (photos waiting to upload) are stored
 * whole, as are Dates, Maps and typed arrays; a function cannot be kept (the write fails), and a class
 * instance comes back as a plain object.
 */
export function keepLocally<T>(key: string, value: T): Promise<void> {
  return set(key, value, pending);
}

export function readLocal<T>(key: string): Promise<T | undefined> {
  return get<T>(key, pending);
}

export function forgetLocal(key: string): Promise<void> {
  return del(key, pending);
}

/** Keys beginning with `prefix`, in key order. */
export async function localKeys(prefix: string): Promise<string[]> {
  const all = await keys<IDBValidKey>(pending);
  return all.filter((key): key is string => typeof key === 'string' && key.startsWith(prefix));
}
