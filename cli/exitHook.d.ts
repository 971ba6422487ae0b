declare module 'async-exit-hook' {
  /** Run `hook` on exit and on SIGINT/SIGTERM; an async hook calls `done` when finished. */
  function exitHook(hook: (done: () => void) => void): void;
  export default exitHook;
}
