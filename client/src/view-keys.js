// The delete keys of the views saved from this browser. The server keeps only a hash of each, so a key lost here
// cannot be had again: the view then stays until someone who has its key deletes it.
const STORAGE_KEY = 'mosaic.saved-view-keys';

function read(storage) {
  try {
    const parsed = JSON.parse(storage?.getItem(STORAGE_KEY) ?? '{}');
    return parsed !== null && typeof parsed === 'object' && !Array.isArray(parsed) ? parsed : {};
  } catch {
    // Unreadable (changed by hand, or storage refused): no keys rather than a broken panel.
    return {};
  }
}

/** Delete keys by view id, in the browser's local storage (none where storage is refused). */
export class ViewKeys {
  #storage;

  constructor(storage = globalThis.localStorage) {
    this.#storage = storage ?? null;
  }

  /** The key of view `id`, or null when it was not saved from this browser. */
  get(id) {
    const key = read(this.#storage)[id];
    return typeof key === 'string' && key !== '' ? key : null;
  }

  /** Remembers the key of a view just saved; false when the browser would not store it. */
  remember(id, key) {
    const keys = read(this.#storage);
    keys[id] = key;
    return this.#write(keys);
  }

  forget(id) {
    const keys = read(this.#storage);
    delete keys[id];
    this.#write(keys);
  }

  #write(keys) {
    try {
      this.#storage?.setItem(STORAGE_KEY, JSON.stringify(keys));
      return this.#storage !== null;
    } catch {
      return false;
    }
  }
}
