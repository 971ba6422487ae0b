/**
 * Acknowledgements released in arrival order, each only once its message is
 * committed. MQTT requires a client to send PUBACKs in the order the PUBLISH
 * packets arrived (MQTT 3.1.1 §4.6, MQTT 5.0 §4.6), while the store may
 * commit a later message in the same batch as an earlier one: a committed
 * message waits here until every message before it is committed too.
 */
export class AckQueue {
  private readonly entries: { id: number; committed: boolean; send?: () => void }[] = [];

  /** A QoS 1 message arrived. */
  arrived(id: number): void {
    this.entries.push({ id, committed: false });
  }

  /** The message is stored (or quarantined): its acknowledgement may go. */
  committed(id: number): void {
    const entry = this.entries.find((e) => e.id === id && !e.committed);
    if (entry) entry.committed = true;
    this.release();
  }

  /**
   * The client wants to send the acknowledgement of `id` now. Returns false
   * when `id` is not held here (send it at once); otherwise it is sent when
   * its turn comes.
   */
  hold(id: number, send: () => void): boolean {
    const entry = this.entries.find((e) => e.id === id && !e.send);
    if (!entry) return false;
    entry.send = send;
    this.release();
    return true;
  }

  get waiting(): number {
    return this.entries.length;
  }

  private release(): void {
    while (this.entries.length > 0 && this.entries[0]!.committed && this.entries[0]!.send) {
      this.entries.shift()!.send!();
    }
  }
}
