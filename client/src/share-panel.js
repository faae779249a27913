// The share panel, opened from the toolbar: the link to the view on screen, a read-only signed link (for a caller
// with the access token) and the field's saved views. While open it follows the view, so the link shown is always
// the one for what is on screen.
import { LinkBox } from './link-box.js';
import { SavedViews } from './saved-views.js';
import { SignedLink } from './signed-link.js';

export class SharePanel {
  #panel;
  #toggle;
  #state;
  #viewLink;
  #link;
  #saved;
  #signed;
  #sequence = 0;

  /** `viewLink` is the page's ViewLink; `stateOf()` gives the view state object a save sends. */
  constructor(panel, toggle, state, viewLink, stateOf) {
    this.#panel = panel;
    this.#toggle = toggle;
    this.#state = state;
    this.#viewLink = viewLink;
    this.#link = new LinkBox(panel);
    const linkInput = panel.querySelector('[data-role=link]');
    this.#signed = new SignedLink(panel, panel.querySelector('[data-role=link-status]'), () => linkInput.value);
    this.#saved = new SavedViews(panel, stateOf);
    toggle.addEventListener('click', () => this.#setOpen(panel.hidden));
    panel.addEventListener('keydown', (event) => {
      if (event.key !== 'Escape') return;
      this.#setOpen(false);
      toggle.focus();
    });
    state.addEventListener('change', () => {
      if (!panel.hidden) this.#showLink();
    });
  }

  /** The field on screen, whose saved views the panel lists. */
  setField(field) {
    this.#saved.setField(field);
    this.#signed.setField(field);
    if (!this.#panel.hidden) this.#saved.refresh();
  }

  #setOpen(open) {
    this.#panel.hidden = !open;
    this.#toggle.setAttribute('aria-expanded', String(open));
    if (!open) return;
    this.#signed.load();
    this.#showLink();
    this.#saved.refresh();
  }

  async #showLink() {
    const sequence = ++this.#sequence;
    this.#link.showPending();
    const query = await this.#viewLink.linkQuery();
    if (sequence !== this.#sequence) return;
    const { x, y } = this.#state.current;
    const sky = this.#state.skyCentre;
    this.#link.show(query, { pixel: x === null || y === null ? null : { x, y }, sky: sky === null ? null : { ra: sky.ra, dec: sky.dec } });
  }
}
