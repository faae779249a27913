// The list of fields. A field the server cannot read stays in the list, disabled, with the reason beside its name.
import { fillSelect, shorten } from './select-options.js';

/** Fires `pick` with the chosen field id in `detail`. */
export class FieldPicker extends EventTarget {
  #select;
  #note;

  constructor(select, note) {
    super();
    this.#select = select;
    this.#note = note;
    select.addEventListener('change', () => this.dispatchEvent(new CustomEvent('pick', { detail: select.value })));
  }

  setFields(fields, selectedId) {
    fillSelect(
      this.#select,
      fields.map((field) => ({
        value: field.id,
        label: field.error ? shorten(`${field.id} — unreadable: ${field.error}`) : field.id,
        disabled: Boolean(field.error),
        title: field.error ? `${field.id} cannot be shown: ${field.error}` : `${field.id}: ${describeSize(field)}`,
      })),
      selectedId,
    );
    const unreadable = fields.filter((field) => field.error).length;
    this.#note.hidden = unreadable === 0;
    this.#note.textContent = unreadable === 1 ? '1 field cannot be read' : `${unreadable} fields cannot be read`;
    this.#note.title = fields.filter((field) => field.error).map((field) => `${field.id}: ${field.error}`).join('\n');
  }
}

function describeSize(field) {
  const bands = field.bands?.length ?? 0;
  const chips = field.hdus?.length ?? 0;
  return `${bands} band${bands === 1 ? '' : 's'}, ${chips} image HDU${chips === 1 ? '' : 's'}`;
}
