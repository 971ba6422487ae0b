declare module 'async-exit-hook' {
  /** Run `hook` on exit and on SIGINT/SIGTERM; an async hook calls `done` when finished. */
  function exitHook(hook: (done: () => void) => void): void;
  namespace exitHook {
    /** Stop listening to one process event (e.g. 'beforeExit'). */
    function unhookEvent(event: string): void;
  }
  export default exitHook;
}
