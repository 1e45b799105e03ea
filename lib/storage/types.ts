/** An object read back from storage. */
export interface StoredObject {
  body: Buffer;
  contentType: string;
}

/**
 * Where uploaded photos live. Keys are made by the server (lib/storage/keys.ts),
 * never taken from a request; every driver refuses a key that does not look
 * like one of ours.
 */
export interface Storage {
  readonly driver: 'local' | 's3';
  /** Stores (or overwrites) an object. */
  put(key: string, body: Buffer, contentType: string): Promise<void>;
  /** Reads an object; null when there is none under that key. */
  get(key: string): Promise<StoredObject | null>;
  /** Removes an object; removing a missing key is not an error. */
  delete(key: string): Promise<void>;
}
