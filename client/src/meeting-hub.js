// The connection to the server's meeting hub (/hubs/meeting) through the SignalR browser client, which the build
// copies to lib/signalr/ and which is loaded only when a meeting begins. It reconnects by itself for as long as the
// page is open, and says so through `onState`.

const SCRIPT = 'lib/signalr/signalr.min.js';
// Retry quickly at first, then every five seconds, never giving up: a meeting outlives a dropped network.
const RETRY_MS = Object.freeze([0, 250, 1000, 2000, 5000]);

let loading = null;

/** The SignalR client (its browser build sets `signalR` on the page), loaded once. */
export function loadSignalR() {
  if (globalThis.signalR) return Promise.resolve(globalThis.signalR);
  loading ??= new Promise((resolve, reject) => {
    const script = document.createElement('script');
    script.src = SCRIPT;
    script.async = true;
    script.addEventListener('load', () => (globalThis.signalR ? resolve(globalThis.signalR) : reject(new Error('the SignalR client did not load'))));
    script.addEventListener('error', () => {
      loading = null;
      script.remove();
      reject(new Error(`the SignalR client (${SCRIPT}) could not be loaded`));
    });
    document.head.append(script);
  });
  return loading;
}

/**
 * One hub connection. `handlers` maps server messages ("view", "pointer", "presenter", "participants", "ended") to
 * functions; `onState` is told 'connecting', 'connected', 'reconnecting' and, after a reconnect, 'reconnected'.
 */
export class MeetingHub {
  #connection = null;
  #handlers;
  #onState;
  #stopped = false;

  constructor(handlers, onState = () => {}) {
    this.#handlers = handlers;
    this.#onState = onState;
  }

  async start() {
    const signalR = await loadSignalR();
    const url = new URL('hubs/meeting', window.location.href).href;
    const connection = new signalR.HubConnectionBuilder()
      .withUrl(url)
      .withAutomaticReconnect({ nextRetryDelayInMilliseconds: ({ previousRetryCount }) => RETRY_MS[Math.min(previousRetryCount, RETRY_MS.length - 1)] })
      .configureLogging(signalR.LogLevel.None)
      .build();
    for (const [name, handler] of Object.entries(this.#handlers)) connection.on(name, handler);
    connection.onreconnecting(() => this.#onState('reconnecting'));
    connection.onreconnected(() => this.#onState('reconnected'));
    // The automatic reconnect never gives up, but a start that failed (server down at the time) ends here: try again.
    connection.onclose(() => {
      if (!this.#stopped) this.#restart();
    });
    this.#connection = connection;
    this.#onState('connecting');
    try {
      await connection.start();
    } catch (error) {
      // Not reachable now: keep trying in the background, and say why meanwhile.
      this.#restart();
      throw error;
    }
    this.#onState('connected');
  }

  /** Calls a hub method and returns its answer; rejects with the server's message for a refused call. */
  invoke(method, ...args) {
    if (this.#connection === null) return Promise.reject(new Error('not connected to the meeting'));
    return this.#connection.invoke(method, ...args).catch((error) => {
      throw new Error(readableError(error));
    });
  }

  /** Sends without waiting for an answer (the many small view and pointer updates); false when not connected. */
  send(method, ...args) {
    if (this.#connection?.state !== 'Connected') return false;
    this.#connection.send(method, ...args).catch(() => {});
    return true;
  }

  get connected() {
    return this.#connection?.state === 'Connected';
  }

  async stop() {
    this.#stopped = true;
    await this.#connection?.stop();
  }

  async #restart() {
    this.#onState('reconnecting');
    for (let attempt = 0; !this.#stopped; attempt++) {
      await new Promise((resolve) => setTimeout(resolve, RETRY_MS[Math.min(attempt + 1, RETRY_MS.length - 1)]));
      if (this.#stopped) return;
      try {
        await this.#connection.start();
        this.#onState('reconnected');
        return;
      } catch {
        // Still unreachable: wait and try again.
      }
    }
  }
}

// SignalR wraps a hub's refusal as "An unexpected error occurred invoking 'X' on the server. HubException: <message>".
function readableError(error) {
  const text = String(error?.message ?? error);
  const marker = 'HubException: ';
  const at = text.indexOf(marker);
  return at >= 0 ? text.slice(at + marker.length) : text;
}
