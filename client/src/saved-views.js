// The views saved on the server for the field on screen: saving the current one with a title and a note, listing
// them newest first, and deleting those saved from this browser (the only ones whose delete key it holds).
import { saveView, listViews, deleteView } from './link-api.js';
import { ViewKeys } from './view-keys.js';

const TITLE_LIMIT = 200;
const NOTE_LIMIT = 4000;

function reason(error) {
  return error?.detail || error?.message || String(error);
}

/** Fires `saved` with the server's answer after a save. `stateOf()` gives the view state object to save. */
export class SavedViews extends EventTarget {
  #form;
  #saveStatus;
  #list;
  #listStatus;
  #heading;
  #stateOf;
  #keys;
  #field = null;
  #listing = null;

  constructor(root, stateOf, keys = new ViewKeys()) {
    super();
    this.#form = root.querySelector('[data-role=save-form]');
    this.#saveStatus = root.querySelector('[data-role=save-status]');
    this.#list = root.querySelector('[data-role=list]');
    this.#listStatus = root.querySelector('[data-role=list-status]');
    this.#heading = root.querySelector('[data-role=list-heading]');
    this.#stateOf = stateOf;
    this.#keys = keys;
    this.#form.elements.title.maxLength = TITLE_LIMIT;
    this.#form.elements.note.maxLength = NOTE_LIMIT;
    this.#form.addEventListener('submit', (event) => {
      event.preventDefault();
      this.#save();
    });
  }

  /** The field whose saved views are listed. */
  setField(field) {
    if (field === this.#field) return;
    this.#field = field;
    if (field === null) {
      this.#heading.textContent = 'Saved views';
    } else {
      // The field's id as written, outside the heading's capitals.
      const name = document.createElement('span');
      name.className = 'share-heading-field';
      name.textContent = field;
      this.#heading.replaceChildren('Saved views of ', name);
    }
    this.#list.replaceChildren();
    this.#listStatus.textContent = '';
  }

  /** Asks the server for the field's saved views again. */
  async refresh() {
    const field = this.#field;
    this.#listing?.abort();
    if (field === null) return;
    const request = new AbortController();
    this.#listing = request;
    this.#listStatus.textContent = 'Loading…';
    try {
      const views = await listViews(field, request.signal);
      if (request.signal.aborted || field !== this.#field) return;
      this.#list.replaceChildren(...views.map((view) => this.#item(view)));
      this.#listStatus.textContent = views.length === 0 ? 'None yet: the form above keeps the view on screen.' : '';
    } catch (error) {
      if (request.signal.aborted) return;
      this.#listStatus.textContent = `The saved views could not be listed: ${reason(error)}`;
    }
  }

  async #save() {
    const button = this.#form.querySelector('button[type=submit]');
    const title = this.#form.elements.title.value.trim();
    const note = this.#form.elements.note.value.trim();
    button.disabled = true;
    this.#saveStatus.textContent = 'Saving…';
    try {
      const body = { state: await this.#stateOf() };
      if (title !== '') body.title = title;
      if (note !== '') body.note = note;
      const saved = await saveView(body);
      const kept = this.#keys.remember(saved.id, saved.deleteKey);
      this.#saveStatus.textContent = kept
        ? `Saved: ${new URL(saved.url.replace(/^\//, ''), document.baseURI).href}`
        : `Saved (${saved.url}), but this browser would not keep its delete key: it cannot be deleted from here.`;
      this.#form.reset();
      this.dispatchEvent(new CustomEvent('saved', { detail: saved }));
      await this.refresh();
    } catch (error) {
      this.#saveStatus.textContent = `The view could not be saved: ${reason(error)}`;
    } finally {
      button.disabled = false;
    }
  }

  #item(view) {
    const item = document.createElement('li');
    item.className = 'saved-view';
    item.dataset.id = view.id;
    const open = document.createElement('a');
    open.className = 'saved-view-title';
    // Relative to the page, like every request, so it also works under a sub-path; the server redirects to the link.
    open.href = view.url.replace(/^\//, '');
    open.textContent = view.title || 'Untitled view';
    const when = document.createElement('time');
    when.className = 'saved-view-time';
    when.dateTime = view.created;
    when.textContent = formatCreated(view.created);
    item.append(open, when);
    if (view.note) {
      const note = document.createElement('p');
      note.className = 'saved-view-note';
      note.textContent = view.note;
      item.append(note);
    }
    const key = this.#keys.get(view.id);
    if (key !== null) {
      const remove = document.createElement('button');
      remove.type = 'button';
      remove.className = 'small-button saved-view-delete';
      remove.dataset.role = 'delete';
      remove.textContent = 'Delete';
      remove.title = 'Saved from this browser: delete it for everyone';
      remove.addEventListener('click', () => this.#delete(view, key, remove));
      item.append(remove);
    }
    return item;
  }

  async #delete(view, key, button) {
    button.disabled = true;
    try {
      await deleteView(view.id, key);
      this.#keys.forget(view.id);
      await this.refresh();
      this.#listStatus.textContent = `Deleted “${view.title || 'Untitled view'}”.`;
    } catch (error) {
      button.disabled = false;
      this.#listStatus.textContent = `“${view.title || 'Untitled view'}” could not be deleted: ${reason(error)}`;
    }
  }
}

// Minutes in UTC, as the server stores it: the same text for everyone the view is shared with.
function formatCreated(iso) {
  const date = new Date(iso);
  if (Number.isNaN(date.getTime())) return '';
  return `${date.toISOString().slice(0, 16).replace('T', ' ')} UTC`;
}
