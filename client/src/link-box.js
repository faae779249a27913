// The link to the view on screen, kept current while the share panel is open, with a button that copies it.

/** Shows the view's link (absolute, with the centre on the sky where it can be) and copies it on request. */
export class LinkBox {
  #input;
  #copy;
  #centre;
  #status;
  #sequence = 0;

  constructor(root) {
    this.#input = root.querySelector('[data-role=link]');
    this.#copy = root.querySelector('[data-role=copy]');
    this.#centre = root.querySelector('[data-role=centre]');
    this.#status = root.querySelector('[data-role=link-status]');
    this.#copy.addEventListener('click', () => this.#copyLink());
    // A click in the box selects the whole link, ready to copy by hand.
    this.#input.addEventListener('focus', () => this.#input.select());
  }

  /** Shows the link for `query` (a link query, '?v=1&…') and says where its centre is. */
  show(query, { pixel = null, sky = null } = {}) {
    this.#sequence += 1;
    this.#input.value = query === '' ? '' : new URL(query, window.location.href).href;
    this.#copy.disabled = query === '';
    this.#status.textContent = '';
    this.#centre.textContent = describeCentre(pixel, sky);
  }

  /** While the centre's sky position is being looked up. */
  showPending() {
    this.#copy.disabled = true;
    this.#status.textContent = 'Finding the centre on the sky…';
  }

  async #copyLink() {
    const sequence = this.#sequence;
    const text = this.#input.value;
    try {
      await navigator.clipboard.writeText(text);
      if (sequence === this.#sequence) this.#status.textContent = 'Copied.';
    } catch {
      // No clipboard access (an insecure page, or refused): leave the link selected for Ctrl+C.
      this.#input.focus();
      this.#input.select();
      if (sequence === this.#sequence) this.#status.textContent = 'This browser did not let the page copy: the link is selected, copy it with Ctrl+C.';
    }
  }
}

function describeCentre(pixel, sky) {
  if (pixel === null) return '';
  const where = `Centre at pixel ${pixel.x}, ${pixel.y}`;
  if (sky === null) return `${where}: the link names it by pixel.`;
  return `${where}: the link names it by RA ${sky.ra.toFixed(7)}°, Dec ${sky.dec >= 0 ? '+' : ''}${sky.dec.toFixed(7)}° (ICRS).`;
}
