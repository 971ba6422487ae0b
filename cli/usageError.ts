/** A command used wrongly: printed as its one-line message, exit code 2. */
export class UsageError extends Error {}
