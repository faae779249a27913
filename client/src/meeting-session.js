// Which meeting this browser tab is in, and its presenter key while it drives, kept in sessionStorage: a reload
// rejoins, another tab starts afresh, and the key never lands in a link or in the page URL.
const STORAGE_KEY = 'mosaic.meeting';

export class MeetingSession {
  #storage;

  constructor(storage = globalThis.sessionStorage) {
    this.#storage = storage ?? null;
  }

  /** {id, key} (key null for a follower), or null outside a meeting. */
  read() {
    try {
      const value = JSON.parse(this.#storage?.getItem(STORAGE_KEY) ?? 'null');
      if (value === null || typeof value.id !== 'string' || value.id === '') return null;
      return { id: value.id, key: typeof value.key === 'string' && value.key !== '' ? value.key : null };
    } catch {
      return null;
    }
  }

  write(id, key = null) {
    try {
      this.#storage?.setItem(STORAGE_KEY, JSON.stringify({ id, key }));
    } catch {
      // Storage refused: the meeting goes on, only a reload will not rejoin it.
    }
  }

  clear() {
    try {
      this.#storage?.removeItem(STORAGE_KEY);
    } catch {
      // Nothing to forget.
    }
  }
}
