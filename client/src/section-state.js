// Marks a display-panel section as not applying to what is shown (a palette under a colour composite): its controls
// are disabled and skipped by Tab, and a note, if it has one, says why.

/** Enables or disables every control in `section`; `note` (an element or null) shows while it is disabled. */
export function setSectionActive(section, active, note = null) {
  section.classList.toggle('inactive', !active);
  section.inert = !active;
  for (const control of section.querySelectorAll('input, select, button')) {
    if (!active) {
      if (!control.disabled) control.dataset.inactive = 'true';
      control.disabled = true;
    } else if (control.dataset.inactive) {
      delete control.dataset.inactive;
      control.disabled = false;
    }
  }
  if (note) note.hidden = active;
}
