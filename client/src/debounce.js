// Calls `action` once input has paused for `ms`: a slider being dragged asks for a new picture every ~100 ms at
// most, not on every pixel of the drag.
export function debounce(action, ms) {
  let timer = null;
  const run = (...args) => {
    clearTimeout(timer);
    timer = setTimeout(() => {
      timer = null;
      action(...args);
    }, ms);
  };
  run.cancel = () => {
    clearTimeout(timer);
    timer = null;
  };
  return run;
}
