// Fills a <select> from a list, shared by the pickers.

const MAX_LABEL = 90;

/** Shortens a label for a list entry; the full text goes in the entry's tooltip. */
export function shorten(text, max = MAX_LABEL) {
  return text.length <= max ? text : `${text.slice(0, max - 1)}…`;
}

function describe(option, entry) {
  option.value = String(entry.value);
  if (option.textContent !== entry.label) option.textContent = entry.label;
  option.disabled = Boolean(entry.disabled);
  option.title = entry.title ?? '';
}

/**
 * Shows `entries` ({value, label, disabled?, title?}) in `select` and selects `selected` where it is one of them.
 * When the values are those already listed the options are updated in place, so an open list stays open while
 * labels change. The select is disabled when nothing in it can be picked.
 */
export function fillSelect(select, entries, selected) {
  const current = [...select.options];
  const sameValues = current.length === entries.length && current.every((option, i) => option.value === String(entries[i].value));
  if (sameValues) {
    current.forEach((option, i) => describe(option, entries[i]));
  } else {
    select.replaceChildren(...entries.map((entry) => {
      const option = document.createElement('option');
      describe(option, entry);
      return option;
    }));
  }
  const wanted = selected === null || selected === undefined ? null : String(selected);
  const match = [...select.options].find((option) => option.value === wanted && !option.disabled);
  if (match) {
    match.selected = true;
  } else {
    select.selectedIndex = -1;
  }
  select.disabled = ![...select.options].some((option) => !option.disabled);
}
