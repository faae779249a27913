// The go-to box: a sky position typed by a person, looked up on the server (which finds the chip holding it). One
// lookup at a time: a new one cancels the last, so only the newest answer moves the view.

/**
 * Fires `found` with the probe answer in `detail` ({hdu, atX, atY, ...} plus `text`, what was typed), `failed`
 * with the error, and `clear` when the mark is to go.
 */
export class GotoBox extends EventTarget {
  #form;
  #input;
  #button;
  #clearButton;
  #lookup;
  #source = null;
  #inFlight = null;

  /** `lookup(source, text, signal)` asks the server; `source` is {field, band, hdu} (hdu: null, or 'canvas'). */
  constructor(form, lookup) {
    super();
    this.#form = form;
    this.#input = form.querySelector('input');
    this.#button = form.querySelector('[data-role="go"]');
    this.#clearButton = form.querySelector('[data-role="clear"]');
    this.#lookup = lookup;
    form.addEventListener('submit', (event) => {
      event.preventDefault();
      this.#go();
    });
    this.#input.addEventListener('keydown', (event) => {
      if (event.key === 'Escape' && !this.#clearButton.hidden) this.#clear();
    });
    this.#clearButton.addEventListener('click', () => this.#clear());
    this.setSource(null);
  }

  /** The band positions are looked up in ({field, band, hdu}), or null while there is none. */
  setSource(source) {
    this.#inFlight?.abort();
    this.#inFlight = null;
    this.#source = source;
    this.#input.disabled = source === null;
    this.#button.disabled = source === null;
    this.#setBusy(false);
  }

  /** Whether a mark is on the image, so the clear button shows. */
  set marked(on) {
    this.#clearButton.hidden = !on;
  }

  async #go() {
    const text = this.#input.value.trim();
    if (this.#source === null) return;
    if (text === '') {
      this.#input.setAttribute('aria-invalid', 'true');
      this.dispatchEvent(new CustomEvent('failed', { detail: new Error('Type a position first: RA and Dec, e.g. 10:00:24.0 -02:18:00 or 150.1 -2.3.') }));
      return;
    }
    this.#inFlight?.abort();
    const controller = new AbortController();
    this.#inFlight = controller;
    this.#setBusy(true);
    try {
      const answer = await this.#lookup(this.#source, text, controller.signal);
      if (this.#inFlight !== controller) return;
      this.#input.removeAttribute('aria-invalid');
      this.dispatchEvent(new CustomEvent('found', { detail: { ...answer, text } }));
    } catch (error) {
      if (controller.signal.aborted || this.#inFlight !== controller) return;
      this.#input.setAttribute('aria-invalid', 'true');
      this.dispatchEvent(new CustomEvent('failed', { detail: error }));
    } finally {
      if (this.#inFlight === controller) {
        this.#inFlight = null;
        this.#setBusy(false);
      }
    }
  }

  #clear() {
    this.#input.removeAttribute('aria-invalid');
    this.dispatchEvent(new CustomEvent('clear'));
  }

  #setBusy(busy) {
    this.#form.classList.toggle('busy', busy);
    this.#form.setAttribute('aria-busy', String(busy));
  }
}
