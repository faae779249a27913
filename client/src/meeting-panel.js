// The meeting's controls: the toolbar button with the meeting's state on it, its drop-down panel (start, join link,
// hand-over, end; or follow, take over, leave), and a bar over the image that says whether this page follows the
// presenter and brings it back in one click. It only shows and asks: meeting.js decides.
// Events: start, join (detail: the id or link typed), end, handover, takeover (detail: the code), leave, rejoin.

const PANEL_HTML = `
  <h2 class="meeting-heading">Live meeting</h2>
  <p class="meeting-status" data-role="status" role="status" hidden></p>
  <div class="meeting-mode" data-mode="idle">
    <p class="meeting-note">Start a meeting and send its link: everyone who opens it sees your view as you move it,
      your display settings and your pointer.</p>
    <button class="wide-button" type="button" data-role="start">Start a meeting</button>
    <form class="meeting-row" data-role="join-form" autocomplete="off">
      <input class="meeting-text" type="text" data-role="join-id" spellcheck="false" aria-label="Meeting link or id" placeholder="Meeting link or id">
      <button class="small-button" type="submit">Join</button>
    </form>
  </div>
  <div class="meeting-mode" data-mode="presenting" hidden>
    <p class="meeting-role"><span class="meeting-live" aria-hidden="true"></span>You are presenting ·
      <span data-role="count">1 here</span></p>
    <label class="meeting-label" for="meeting-join-link">Link for the others</label>
    <div class="meeting-row">
      <input id="meeting-join-link" class="meeting-text" type="text" readonly data-role="join-link">
      <button class="small-button" type="button" data-role="copy-join">Copy</button>
    </div>
    <button class="small-button" type="button" data-role="handover">Let someone else present…</button>
    <div class="meeting-handover" data-role="handover-box" hidden>
      <p class="meeting-note">Send this link (or the code in it) to the next presenter. It works once, within
        30 minutes; when it is used, this page follows like everyone else.</p>
      <div class="meeting-row">
        <input class="meeting-text" type="text" readonly data-role="handover-link" aria-label="Hand-over link">
        <button class="small-button" type="button" data-role="copy-handover">Copy</button>
      </div>
    </div>
    <button class="small-button meeting-end" type="button" data-role="end">End the meeting for everyone</button>
  </div>
  <div class="meeting-mode" data-mode="following" hidden>
    <p class="meeting-role"><span class="meeting-live" aria-hidden="true"></span><span data-role="follow-text">Following the presenter</span> ·
      <span data-role="count">1 here</span></p>
    <form class="meeting-row" data-role="takeover-form" autocomplete="off">
      <input class="meeting-text" type="text" data-role="takeover-code" spellcheck="false" aria-label="Hand-over code" placeholder="Hand-over code">
      <button class="small-button" type="submit">Present</button>
    </form>
    <button class="small-button" type="button" data-role="leave">Leave the meeting</button>
  </div>`;

const BAR_HTML = `
  <span class="meeting-live" aria-hidden="true"></span>
  <span class="meeting-bar-text" data-role="text"></span>
  <button class="small-button meeting-rejoin" type="button" data-role="rejoin" hidden>Back to the presenter</button>`;

function countText(count) {
  return count === 1 ? '1 here' : `${count} here`;
}

export class MeetingPanel extends EventTarget {
  #root;
  #toggle;
  #bar;
  #mode = 'idle';

  constructor(root, toggle, stage) {
    super();
    this.#root = root;
    this.#toggle = toggle;
    root.innerHTML = PANEL_HTML;
    this.#bar = document.createElement('div');
    this.#bar.className = 'meeting-bar';
    this.#bar.setAttribute('role', 'status');
    this.#bar.hidden = true;
    this.#bar.innerHTML = BAR_HTML;
    stage.append(this.#bar);

    toggle.addEventListener('click', () => this.#setOpen(root.hidden));
    document.addEventListener('keydown', (event) => {
      if (event.key === 'Escape' && !root.hidden) this.#setOpen(false);
    });
    const on = (role, type, detail = () => undefined) => this.#part(role).addEventListener('click', () => this.#emit(type, detail()));
    on('start', 'start');
    on('handover', 'handover');
    on('end', 'end');
    on('leave', 'leave');
    on('copy-join', 'copy', () => this.#part('join-link'));
    on('copy-handover', 'copy', () => this.#part('handover-link'));
    this.#bar.querySelector('[data-role=rejoin]').addEventListener('click', () => this.#emit('rejoin'));
    this.#part('join-form').addEventListener('submit', (event) => {
      event.preventDefault();
      const text = this.#part('join-id').value.trim();
      if (text) this.#emit('join', text);
    });
    this.#part('takeover-form').addEventListener('submit', (event) => {
      event.preventDefault();
      const text = this.#part('takeover-code').value.trim();
      if (text) this.#emit('takeover', text);
    });
  }

  /** The panel and the controls inside it: changes made there are not the viewer's own moves. */
  get element() {
    return this.#root;
  }

  showIdle() {
    this.#setMode('idle');
    this.#toggle.dataset.meeting = '';
    this.#bar.hidden = true;
  }

  showPresenting(joinLink) {
    this.#setMode('presenting');
    this.#part('join-link').value = joinLink;
    this.#part('handover-box').hidden = true;
    this.#toggle.dataset.meeting = 'presenting';
    this.#bar.hidden = false;
    this.#bar.dataset.mode = 'presenting';
    this.#barText('Presenting live');
    this.#part('rejoin', this.#bar).hidden = true;
  }

  /** Following (`following` true) or looking around on one's own (false, with the way back). */
  showFollowing(following) {
    this.#setMode('following');
    this.#part('takeover-code').value = '';
    this.#toggle.dataset.meeting = following ? 'following' : 'away';
    this.#root.querySelector('[data-role=follow-text]').textContent = following ? 'Following the presenter' : 'Looking around on your own';
    this.#bar.hidden = false;
    this.#bar.dataset.mode = following ? 'following' : 'away';
    this.#barText(following ? 'Following the presenter' : 'Looking around on your own');
    this.#part('rejoin', this.#bar).hidden = following;
  }

  showHandOver(link) {
    this.#part('handover-box').hidden = false;
    this.#part('handover-link').value = link;
    this.#part('handover-link').select();
  }

  setParticipants(count) {
    for (const element of this.#root.querySelectorAll('[data-role=count]')) element.textContent = countText(count);
    this.#bar.dataset.count = String(count);
    this.#barText();
  }

  /** A line about the connection or the last request; null clears it. */
  setStatus(text, kind = 'info') {
    const status = this.#part('status');
    status.hidden = text === null;
    status.textContent = text ?? '';
    status.dataset.kind = kind;
    this.#bar.dataset.connection = kind === 'connection' ? 'down' : 'up';
  }

  open() {
    this.#setOpen(true);
  }

  #barText(text = this.#bar.dataset.text) {
    this.#bar.dataset.text = text ?? '';
    const count = Number(this.#bar.dataset.count ?? 1);
    this.#bar.querySelector('[data-role=text]').textContent = `${text ?? ''} · ${countText(count)}`;
  }

  #setMode(mode) {
    this.#mode = mode;
    for (const section of this.#root.querySelectorAll('[data-mode]')) section.hidden = section.dataset.mode !== mode;
  }

  #setOpen(open) {
    this.#root.hidden = !open;
    this.#toggle.setAttribute('aria-expanded', String(open));
  }

  #part(role, root = this.#root) {
    return root.querySelector(`[data-role=${role}]`);
  }

  #emit(type, detail) {
    this.dispatchEvent(new CustomEvent(type, { detail }));
  }
}
