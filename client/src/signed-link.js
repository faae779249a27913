// The read-only link of the share panel. A caller with the access token can make, for the field on screen, a link
// that carries a signed token: it opens this field only, to look at, until it expires. A caller who came in by such
// a link is told what it allows instead.
import { ApiError } from './api-error.js';

const LIFETIMES = Object.freeze([
  ['1 hour', 3600],
  ['1 day', 86400],
  ['7 days', 7 * 86400],
  ['30 days', 30 * 86400],
]);

/** Who the page's caller is: { caller: 'full' | 'public' | 'share', field, expires, canShare }. */
export async function describeAccess(signal) {
  const response = await fetch('api/access', { signal, headers: { Accept: 'application/json' } });
  if (!response.ok) throw await ApiError.fromResponse(response);
  return response.json();
}

/** Asks for a read-only token for `field`, valid `seconds`; answers { token, field, expires }. */
export async function createShareToken(field, seconds) {
  const response = await fetch(`api/fields/${encodeURIComponent(field)}/share-tokens`, {
    method: 'POST',
    headers: { Accept: 'application/json', 'Content-Type': 'application/json' },
    body: JSON.stringify({ lifetimeSeconds: seconds }),
  });
  if (!response.ok) throw await ApiError.fromResponse(response);
  return response.json();
}

/** `link` (an absolute view link) with the share token added: opening it signs the browser in for that field. */
export function withToken(link, token) {
  const url = new URL(link);
  url.searchParams.set('token', token);
  return url.href;
}

export class SignedLink {
  #section;
  #lifetime;
  #make;
  #output;
  #status;
  #note;
  #linkOf;
  #field = null;
  #access = null;
  #sequence = 0;

  /** Adds its controls to `panel` after `anchor`; `linkOf()` gives the view's current link (absolute, '' while pending). */
  constructor(panel, anchor, linkOf) {
    this.#linkOf = linkOf;
    this.#section = document.createElement('div');
    this.#section.className = 'signed-link';
    this.#section.dataset.role = 'signed-link-section';
    this.#section.hidden = true;
    const heading = document.createElement('h2');
    heading.className = 'share-heading';
    heading.textContent = 'Read-only link';
    const row = document.createElement('div');
    row.className = 'share-link-row';
    this.#lifetime = document.createElement('select');
    this.#lifetime.dataset.role = 'signed-lifetime';
    this.#lifetime.setAttribute('aria-label', 'How long the read-only link works');
    for (const [label, seconds] of LIFETIMES) this.#lifetime.append(new Option(`Works for ${label}`, String(seconds)));
    this.#lifetime.value = String(86400);
    this.#make = document.createElement('button');
    this.#make.type = 'button';
    this.#make.dataset.role = 'make-signed';
    this.#make.textContent = 'Make link';
    row.append(this.#lifetime, this.#make);
    this.#output = document.createElement('input');
    this.#output.type = 'text';
    this.#output.readOnly = true;
    this.#output.className = 'share-link';
    this.#output.dataset.role = 'signed-link';
    this.#output.spellcheck = false;
    this.#output.setAttribute('aria-label', 'Read-only link to this field');
    this.#output.addEventListener('focus', () => this.#output.select());
    this.#status = document.createElement('p');
    this.#status.className = 'share-note share-status';
    this.#status.dataset.role = 'signed-status';
    this.#status.setAttribute('role', 'status');
    const explain = document.createElement('p');
    explain.className = 'share-note';
    explain.textContent = 'Whoever has this link can look at this field only (no saving, no meetings) until it expires.';
    this.#section.append(heading, explain, row, this.#output, this.#status);
    this.#note = document.createElement('p');
    this.#note.className = 'share-note';
    this.#note.dataset.role = 'access-note';
    this.#note.hidden = true;
    anchor.after(this.#section, this.#note);
    this.#make.addEventListener('click', () => this.#create());
  }

  /** Finds out once what the caller may do; a failure leaves the section hidden (the rest of the panel works). */
  async load() {
    if (this.#access !== null) return;
    try {
      this.#access = await describeAccess();
    } catch {
      this.#access = { caller: 'public', canShare: false };
    }
    this.#section.hidden = !this.#access.canShare;
    if (this.#access.caller === 'share') {
      this.#note.hidden = false;
      const until = new Date(this.#access.expires).toLocaleString();
      this.#note.textContent = `You opened a read-only link to field “${this.#access.field}”; it works until ${until}.`;
    }
  }

  setField(field) {
    if (field === this.#field) return;
    this.#field = field;
    this.#sequence += 1;
    this.#output.value = '';
    this.#status.textContent = '';
  }

  async #create() {
    const field = this.#field;
    const link = this.#linkOf();
    if (field === null || link === '') {
      this.#status.textContent = 'The view’s link is not ready yet; try again in a moment.';
      return;
    }
    const sequence = ++this.#sequence;
    this.#make.disabled = true;
    this.#status.textContent = 'Signing…';
    try {
      const share = await createShareToken(field, Number(this.#lifetime.value));
      if (sequence !== this.#sequence) return;
      this.#output.value = withToken(link, share.token);
      this.#status.textContent = `Works until ${new Date(share.expires).toLocaleString()}.`;
    } catch (error) {
      if (sequence === this.#sequence) this.#status.textContent = `No link: ${error.message}`;
    } finally {
      this.#make.disabled = false;
    }
  }
}
