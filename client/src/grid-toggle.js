// The toolbar button that shows or hides the coordinate grid.

/** Fires `toggle` with the state asked for (true: grid on) in `detail`. */
export class GridToggle extends EventTarget {
  #button;

  constructor(button) {
    super();
    this.#button = button;
    button.addEventListener('click', () => this.dispatchEvent(new CustomEvent('toggle', { detail: !this.pressed })));
  }

  get pressed() {
    return this.#button.getAttribute('aria-pressed') === 'true';
  }

  set pressed(on) {
    this.#button.setAttribute('aria-pressed', String(on));
  }

  /** Disabled, with the reason as tooltip, while the HDU shown has no celestial WCS. */
  setAvailable(available, reason = '') {
    this.#button.disabled = !available;
    this.#button.title = available ? 'Show or hide the RA/Dec grid' : `No coordinate grid: ${reason || 'the chip has no celestial WCS'}`;
  }
}
