// One line for what went wrong or what the app did instead of what was asked.
export class MessageLine {
  #element;
  #topic = null;

  constructor(element) {
    this.#element = element;
  }

  /** Shows `text`; `topic` names what it is about, so that clearing one topic leaves another's message up. */
  show(text, topic = 'general') {
    this.#element.textContent = text;
    this.#element.hidden = false;
    this.#topic = topic;
  }

  /** Hides the message if it is about `topic`, or whatever it is about when no topic is given. */
  clear(topic = null) {
    if (this.#element.hidden || (topic !== null && topic !== this.#topic)) return;
    this.#element.hidden = true;
    this.#element.textContent = '';
    this.#topic = null;
  }
}
