/** Poll until the condition holds, or fail after `timeoutMs` with `what`. */
export async function waitFor(
  condition: () => boolean | Promise<boolean>,
  timeoutMs = 15_000,
  what = 'condition',
): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    if (await condition()) return;
    if (Date.now() > deadline) throw new Error(`timed out after ${timeoutMs} ms waiting for ${what}`);
    await new Promise((r) => setTimeout(r, 50));
  }
}
