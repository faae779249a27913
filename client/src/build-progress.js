// How far the tiles of the viewed HDU are prepared, shown until they are ready.

export class BuildProgress {
  #element;
  #label;
  #bar;
  #percent;

  constructor(element) {
    this.#element = element;
    this.#label = element.querySelector('[data-role="label"]');
    this.#bar = element.querySelector('[data-role="bar"]');
    this.#percent = element.querySelector('[data-role="percent"]');
  }

  /** Shows the pyramid state ({state, progress, error}) of the HDU named `hduName`; hides itself once ready. */
  show(hduName, pyramid) {
    const state = pyramid?.state ?? 'queued';
    this.#element.hidden = state === 'ready';
    this.#element.dataset.state = state;
    if (state === 'ready') return;
    const percent = Math.max(0, Math.min(100, Math.floor((pyramid?.progress ?? 0) * 100)));
    this.#bar.value = percent;
    this.#bar.hidden = state === 'failed';
    this.#percent.textContent = state === 'failed' ? '' : `${percent} %`;
    this.#label.textContent = {
      queued: `Waiting to prepare the tiles of ${hduName}…`,
      building: `Preparing the tiles of ${hduName}…`,
      failed: `The tiles of ${hduName} could not be prepared: ${pyramid?.error ?? 'unknown error'}`,
    }[state] ?? `Tiles of ${hduName}: ${state}`;
  }

  hide() {
    this.#element.hidden = true;
  }
}
