// Polls one field while any HDU of the viewed band is still being prepared, and reports each new field state.
import { getField } from './api.js';

const INTERVAL_MS = 500;
const MAX_BACKOFF_MS = 8000;

export class FieldWatcher {
  #timer = null;
  #controller = null;
  #generation = 0;

  /** Calls `onField(field)` every poll and `onError(error)` when a poll fails, until `isDone(field)` or stop(). */
  watch(fieldId, { onField, onError = () => {}, isDone }) {
    this.stop();
    const generation = this.#generation;
    let delay = INTERVAL_MS;
    const poll = async () => {
      this.#controller = new AbortController();
      try {
        const field = await getField(fieldId, this.#controller.signal);
        if (generation !== this.#generation) return;
        delay = INTERVAL_MS;
        onField(field);
        if (isDone(field)) return;
      } catch (error) {
        if (generation !== this.#generation) return;
        onError(error);
        // The server may be restarting: ask less often.
        delay = Math.min(delay * 2, MAX_BACKOFF_MS);
      }
      this.#timer = setTimeout(poll, delay);
    };
    this.#timer = setTimeout(poll, INTERVAL_MS);
  }

  stop() {
    this.#generation += 1;
    clearTimeout(this.#timer);
    this.#timer = null;
    this.#controller?.abort();
    this.#controller = null;
  }
}
