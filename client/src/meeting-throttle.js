// At most one call per interval, the first at once and the newest arguments last, so the final position is never
// dropped (a pan's end, the pointer leaving the image).

/** `action` called at most every `ms` milliseconds with the newest arguments; `cancel()` drops a pending call. */
export function throttle(action, ms) {
  let last = -Infinity;
  let timer = null;
  let pending = null;
  const run = () => {
    timer = null;
    last = performance.now();
    const args = pending;
    pending = null;
    action(...args);
  };
  const throttled = (...args) => {
    pending = args;
    if (timer !== null) return;
    const wait = last + ms - performance.now();
    if (wait <= 0) run();
    else timer = setTimeout(run, wait);
  };
  throttled.cancel = () => {
    clearTimeout(timer);
    timer = null;
    pending = null;
  };
  return throttled;
}
