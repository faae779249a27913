// The toolbar button that shows or hides the chip outlines, and beside it a note naming the chips the whole field
// leaves out (no usable sky coordinates, say), with each one's reason in its tooltip.

/** Fires `toggle` with the state asked for (true: outlines on) in `detail`. */
export class OutlineToggle extends EventTarget {
  #button;
  #note;

  constructor(button, note) {
    super();
    this.#button = button;
    this.#note = note;
    button.addEventListener('click', () => this.dispatchEvent(new CustomEvent('toggle', { detail: !this.pressed })));
  }

  get pressed() {
    return this.#button.getAttribute('aria-pressed') === 'true';
  }

  set pressed(on) {
    this.#button.setAttribute('aria-pressed', String(on));
  }

  /**
   * What the view shows: `canvas` the whole field's entry (whole-field.js) or null on a single chip, where there
   * are no outlines to draw.
   */
  setCanvas(canvas) {
    this.#button.disabled = canvas === null;
    this.#button.title = canvas === null
      ? 'Chip outlines are drawn over the whole field: pick “Whole field” to see them'
      : 'Show or hide the outline and name of each chip';
    const excluded = canvas?.excluded ?? [];
    this.#note.hidden = excluded.length === 0;
    this.#note.textContent = excluded.length === 1 ? '1 chip left off' : `${excluded.length} chips left off`;
    this.#note.title = excluded.map((chip) => `${chip.name} (HDU ${chip.hdu}): ${chip.reason}`).join('\n');
    this.#note.setAttribute('aria-label', `Left off the whole field: ${this.#note.title.replaceAll('\n', '; ')}`);
  }
}
