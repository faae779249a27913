// Live meetings. A presenter's page sends its view state (the link's parameters, pixel form: exact and needing no
// sky lookup) and its pointer to the server's hub, each at most 30 times a second; every follower's page applies
// the state through the app's `showView` and draws the pointer. A follower who pans, zooms or changes a setting
// looks around on its own until it goes back with one click. The connection reconnects by itself and joins the
// same meeting again; a reload rejoins through sessionStorage (meeting-session.js).
// Fires `meeting-sent` on the document when this page sends its state as presenter, and `meeting-view` after a
// presenter's state is applied here, both with detail {state, at} (`at`: performance.timeOrigin +
// performance.now(), a clock that pages on one machine share; `meeting-view` also has `receivedAt`, when the state
// arrived), so the delay between them can be measured.
import { formatViewQuery, parseViewQuery } from './state.js';
import { linkQueryOf, stateObjectOf } from './view-link.js';
import { ApiError } from './api-error.js';
import { MeetingHub } from './meeting-hub.js';
import { MeetingPanel } from './meeting-panel.js';
import { MeetingSession } from './meeting-session.js';
import { createPresenterPointer } from './meeting-pointer.js';
import { throttle } from './meeting-throttle.js';

// About 30 updates a second: smooth to the eye, and a few hundred bytes each.
const SEND_MS = 33;
// A move this soon after the viewer's own input (wheel, key, press) is the viewer's, not the presenter's.
const GESTURE_MS = 800;
const MEETING_ID = /^[A-Za-z0-9_-]{8,64}$/;

function now() {
  return performance.timeOrigin + performance.now();
}

function round(value) {
  return Math.round(value * 100) / 100;
}

/** A meeting id from what a person typed or pasted: the id itself or a link carrying `meeting=`. */
export function meetingIdOf(text) {
  const trimmed = String(text ?? '').trim();
  if (MEETING_ID.test(trimmed)) return trimmed;
  try {
    const id = new URL(trimmed, window.location.href).searchParams.get('meeting');
    return id !== null && MEETING_ID.test(id) ? id : null;
  } catch {
    return null;
  }
}

async function startMeeting(state) {
  const response = await fetch('api/meetings', {
    method: 'POST',
    headers: { 'Content-Type': 'application/json', Accept: 'application/json' },
    body: JSON.stringify({ state }),
  });
  if (!response.ok) throw await ApiError.fromResponse(response);
  return response.json();
}

export class Meeting {
  #state;
  #imageView;
  #showView;
  #panel;
  #session;
  #hub = null;
  #id = null;
  #key = null;
  // Following the presenter (true), or looking around on one's own (false); meaningless while presenting.
  #following = true;
  // The presenter's newest state and pointer, for going back after looking around.
  #presenterState = null;
  #pointerAt = null;
  #pointer = createPresenterPointer();
  #pointerShown = false;
  #applying = 0;
  #pending = null;
  #scheduled = false;
  #held = false;
  #lastGesture = -Infinity;
  #sendView;
  #sendPointer;
  #opening;

  /**
   * `showView(state)` applies a parsed view state to the page (field, band, HDU, display, overlays and the centre
   * and zoom) and may return a promise; `viewElement` is the image view's element, whose input (press, wheel, keys)
   * marks the moves that follow as the viewer's own; `guarded` are the elements whose controls, when the viewer
   * changes them, count as looking around.
   */
  constructor({ root, toggle, stage, state, imageView, viewElement, showView, guarded = [], search = window.location.search }) {
    this.#state = state;
    this.#imageView = imageView;
    this.#showView = showView;
    this.#session = new MeetingSession();
    this.#panel = new MeetingPanel(root, toggle, stage);
    // Read now: the page URL is rewritten with the view's own parameters as soon as the first field opens.
    const query = new URLSearchParams(search);
    this.#opening = { id: query.get('meeting'), code: query.get('takeover') };
    this.#sendView = throttle((view) => {
      if (this.#hub?.send('Present', this.#id, this.#key, view)) {
        document.dispatchEvent(new CustomEvent('meeting-sent', { detail: { state: view, at: now() } }));
      }
    }, SEND_MS);
    this.#sendPointer = throttle((at) => this.#hub?.send('Point', this.#id, this.#key, at), SEND_MS);
    this.#wirePanel();
    this.#wireViewer(imageView, viewElement, guarded);
    this.#panel.showIdle();
  }

  /** Call once the page shows its first view: joins the meeting the link or this tab's session names. */
  async start() {
    const saved = this.#session.read();
    const linked = meetingIdOf(this.#opening.id ?? '');
    if (this.#opening.id !== null && linked === null) {
      this.#panel.setStatus(`“${this.#opening.id}” is not a meeting id.`, 'error');
      this.#panel.open();
      return;
    }
    if (linked !== null) {
      const key = saved?.id === linked ? saved.key : null;
      await this.#enter(linked, key);
      if (this.#opening.code) await this.#takeOver(this.#opening.code);
    } else if (saved !== null) {
      await this.#enter(saved.id, saved.key);
    }
  }

  get presenting() {
    return this.#key !== null;
  }

  #wirePanel() {
    const panel = this.#panel;
    panel.addEventListener('start', () => this.#start());
    panel.addEventListener('join', (event) => {
      const id = meetingIdOf(event.detail);
      if (id === null) panel.setStatus('That is not a meeting link or id.', 'error');
      else this.#enter(id, null);
    });
    panel.addEventListener('end', () => this.#end());
    panel.addEventListener('leave', () => this.#leave('You left the meeting.'));
    panel.addEventListener('handover', () => this.#handOver());
    panel.addEventListener('takeover', (event) => this.#takeOver(event.detail));
    panel.addEventListener('rejoin', () => this.#rejoin());
    panel.addEventListener('copy', (event) => this.#copy(event.detail));
  }

  #wireViewer(imageView, container, guarded) {
    const gesture = () => {
      this.#lastGesture = performance.now();
    };
    // Capturing: Leaflet's own controls stop these from bubbling.
    container.addEventListener('pointerdown', () => {
      this.#held = true;
      gesture();
    }, { capture: true });
    window.addEventListener('pointerup', () => {
      if (this.#held) gesture();
      this.#held = false;
    }, { capture: true });
    for (const type of ['wheel', 'keydown', 'touchstart', 'dblclick']) container.addEventListener(type, gesture, { capture: true, passive: true });
    imageView.addEventListener('moving', (event) => this.#onMoving(event.detail));
    imageView.addEventListener('pointer', (event) => this.#onPointer(event.detail));
    for (const element of guarded) {
      for (const type of ['input', 'change']) {
        element.addEventListener(type, (event) => {
          if (event.isTrusted && !this.#panel.element.contains(event.target)) this.#lookAround();
        });
      }
    }
    this.#state.addEventListener('change', () => this.#onStateChange());
  }

  // The presenter's view while it moves: the state with the centre and zoom of this instant.
  #onMoving(view) {
    if (this.#id === null) return;
    if (this.presenting) {
      const current = this.#state.current;
      this.#sendView(this.#wireState({ ...current, x: round(view.x), y: round(view.y), z: round(view.z) }));
    } else if (this.#following && this.#applying === 0 && (this.#held || performance.now() - this.#lastGesture < GESTURE_MS)) {
      this.#lookAround();
    }
  }

  #onStateChange() {
    if (this.#id !== null && this.presenting) this.#sendView(this.#wireState(this.#state.current));
    if (!this.presenting) this.#placePointer();
  }

  #onPointer(at) {
    if (this.#id === null || !this.presenting) return;
    this.#sendPointer(at === null ? null : { x: at.x, y: at.y });
  }

  #wireState(state) {
    return stateObjectOf(formatViewQuery(state));
  }

  async #start() {
    this.#panel.setStatus('Starting the meeting…');
    try {
      const started = await startMeeting(this.#wireState(this.#state.current));
      await this.#enter(started.id, started.presenterKey);
    } catch (error) {
      this.#panel.setStatus(`The meeting could not be started: ${error.detail || error.message}`, 'error');
    }
  }

  // Joins meeting `id`, presenting with `key` or following without.
  async #enter(id, key) {
    if (this.#hub !== null) await this.#disconnect();
    this.#id = id;
    this.#key = key;
    this.#following = true;
    this.#session.write(id, key);
    this.#showRole();
    this.#hub = new MeetingHub({
      view: (state) => this.#onPresenterView(state, now()),
      pointer: (at) => this.#onPresenterPointer(at),
      presenter: () => this.#onPresenterChanged(),
      participants: (count) => this.#panel.setParticipants(count),
      ended: () => this.#leave('The presenter ended the meeting.'),
    }, (state) => this.#onConnection(state));
    try {
      await this.#hub.start();
    } catch (error) {
      this.#panel.setStatus(`Cannot reach the meeting (${error.message}); trying again.`, 'connection');
    }
  }

  async #onConnection(state) {
    if (state === 'reconnecting') this.#panel.setStatus('Connection lost; reconnecting…', 'connection');
    if (state !== 'connected' && state !== 'reconnected') return;
    try {
      const current = await this.#hub.invoke('Join', this.#id);
      this.#panel.setStatus(null);
      if (this.presenting) {
        // What this page shows is the meeting's view, also what changed while the connection was down; asked, not
        // just sent, since the meeting may have been handed over meanwhile and this key no longer drives it.
        try {
          await this.#hub.invoke('Present', this.#id, this.#key, this.#wireState(this.#state.current));
        } catch (error) {
          if (/presenter key/.test(error.message)) {
            this.#onPresenterChanged();
            this.#onPresenterView(current);
          } else {
            this.#panel.setStatus(`Your view could not be sent: ${error.message}`, 'error');
          }
        }
      } else {
        this.#onPresenterView(current);
      }
    } catch (error) {
      this.#leave(`The meeting cannot be joined: ${error.message}`);
    }
  }

  // States that arrive while one is being shown are not queued up behind it: only the newest is shown next, so a
  // slow page falls behind by one state at most, never by a backlog.
  #onPresenterView(state, receivedAt = now()) {
    if (this.presenting || state === null || typeof state !== 'object') return;
    this.#presenterState = state;
    if (!this.#following) return;
    this.#pending = { state, receivedAt };
    this.#schedule();
  }

  #schedule() {
    if (this.#scheduled || this.#applying > 0) return;
    this.#scheduled = true;
    // A task, not a microtask: messages already waiting are read first, and only the last of them is shown.
    setTimeout(() => {
      this.#scheduled = false;
      const next = this.#pending;
      this.#pending = null;
      if (next !== null && this.#following && !this.presenting) this.#apply(next.state, next.receivedAt);
    }, 0);
  }

  async #apply(state, receivedAt = now()) {
    this.#applying++;
    try {
      await this.#showView(parseViewQuery(linkQueryOf(state)));
    } catch (error) {
      this.#panel.setStatus(`The presenter's view could not be shown: ${error.detail || error.message}`, 'error');
      return;
    } finally {
      this.#applying--;
      if (this.#pending !== null) this.#schedule();
    }
    this.#placePointer();
    document.dispatchEvent(new CustomEvent('meeting-view', { detail: { state, receivedAt, at: now() } }));
  }

  #onPresenterPointer(at) {
    if (this.presenting) return;
    this.#pointerAt = at !== null && Number.isFinite(at?.x) && Number.isFinite(at?.y) ? { x: at.x, y: at.y } : null;
    this.#placePointer();
  }

  // The pointer is on the presenter's band and HDU: drawn only where this page shows the same.
  #placePointer() {
    const presenter = this.#presenterState;
    const here = this.#state.current;
    const same = presenter !== null && presenter.field === here.field && (presenter.band ?? null) === here.band
      && String(presenter.hdu ?? '') === String(here.hdu ?? '');
    const show = this.#id !== null && !this.presenting && this.#pointerAt !== null && same;
    if (show) this.#pointer.moveTo(this.#pointerAt.x, this.#pointerAt.y);
    if (show !== this.#pointerShown) {
      if (show) this.#imageView.addOverlay(this.#pointer);
      else this.#imageView.removeOverlay(this.#pointer);
      this.#pointerShown = show;
    }
  }

  #lookAround() {
    if (this.#id === null || this.presenting || !this.#following) return;
    this.#following = false;
    this.#panel.showFollowing(false);
  }

  async #rejoin() {
    if (this.#id === null || this.presenting) return;
    this.#following = true;
    this.#panel.showFollowing(true);
    if (this.#presenterState !== null) await this.#apply(this.#presenterState);
  }

  async #handOver() {
    try {
      const code = await this.#hub.invoke('HandOver', this.#id, this.#key);
      const link = new URL(`?meeting=${encodeURIComponent(this.#id)}&takeover=${encodeURIComponent(code)}`, window.location.href).href;
      this.#panel.showHandOver(link);
      this.#panel.setStatus(null);
    } catch (error) {
      this.#panel.setStatus(`No hand-over: ${error.message}`, 'error');
    }
  }

  async #takeOver(text) {
    // A pasted hand-over link works as well as the bare code.
    let code = String(text).trim();
    try {
      code = new URL(code).searchParams.get('takeover') ?? code;
    } catch {
      // Not a link: the code itself.
    }
    try {
      const key = await this.#hub.invoke('TakeOver', this.#id, code);
      this.#key = key;
      this.#session.write(this.#id, key);
      this.#showRole();
      this.#panel.setStatus('You are presenting now.');
      this.#sendView(this.#wireState(this.#state.current));
    } catch (error) {
      this.#panel.setStatus(`Could not take over: ${error.message}`, 'error');
      this.#panel.open();
    }
  }

  // Someone else took over: this page's key no longer drives, so it follows.
  #onPresenterChanged() {
    if (!this.presenting) return;
    this.#key = null;
    this.#session.write(this.#id, null);
    this.#sendView.cancel();
    this.#sendPointer.cancel();
    this.#following = true;
    this.#presenterState = this.#wireState(this.#state.current);
    this.#showRole();
    this.#panel.setStatus('Someone else is presenting now; you follow them.');
  }

  async #end() {
    try {
      await this.#hub.invoke('End', this.#id, this.#key);
      await this.#leave('You ended the meeting.');
    } catch (error) {
      this.#panel.setStatus(`The meeting could not be ended: ${error.message}`, 'error');
    }
  }

  async #leave(reason) {
    this.#session.clear();
    await this.#disconnect();
    this.#id = null;
    this.#key = null;
    this.#presenterState = null;
    this.#pointerAt = null;
    this.#placePointer();
    this.#panel.showIdle();
    this.#panel.setStatus(reason);
  }

  async #disconnect() {
    this.#sendView.cancel();
    this.#sendPointer.cancel();
    const hub = this.#hub;
    this.#hub = null;
    await hub?.stop().catch(() => {});
  }

  #showRole() {
    if (this.presenting) {
      this.#panel.showPresenting(new URL(`?meeting=${encodeURIComponent(this.#id)}`, window.location.href).href);
    } else {
      this.#panel.showFollowing(this.#following);
    }
  }

  async #copy(input) {
    input.select();
    try {
      await navigator.clipboard.writeText(input.value);
      this.#panel.setStatus('Copied.');
    } catch {
      this.#panel.setStatus('Selected: copy it with Ctrl+C.');
    }
  }
}
