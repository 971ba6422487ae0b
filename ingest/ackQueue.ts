/**
 * Acknowledgements released in arrival order, each only once its message is
 * committed. MQTT requires a client to send PUBACKs in the order the PUBLISH
 * packets arrived (MQTT 3.1.1 §4.6, MQTT 5.0 §4.6), while the store may
 * commit a later message in the same batch as an earlier one: a committed
 * message waits here until every message before it is committed too.
 */
interface Entry {
  id: number;
  committed: boolean;
  send?: () => void;
}

export class AckQueue {
  private readonly order: Entry[] = [];
  private head = 0;
  /** Entries by message id, oldest first (an id is reused only after its PUBACK). */
  private readonly byId = new Map<number, Entry[]>();

  /** A QoS 1 message arrived. */
  arrived(id: number): void {
    const entry: Entry = { id, committed: false };
    this.order.push(entry);
    const same = this.byId.get(id);
    if (same) same.push(entry);
    else this.byId.set(id, [entry]);
  }

  /** The message is stored (or quarantined): its acknowledgement may go. */
  committed(id: number): void {
    const entry = this.byId.get(id)?.find((e) => !e.committed);
    if (entry) entry.committed = true;
    this.release();
  }

  /**
   * The client wants to send the acknowledgement of `id` now. Returns false
   * when `id` is not held here (send it at once); otherwise it is sent when
   * its turn comes.
   */
  hold(id: number, send: () => void): boolean {
    const entry = this.byId.get(id)?.find((e) => !e.send);
    if (!entry) return false;
    entry.send = send;
    this.release();
    return true;
  }

  get waiting(): number {
    return this.order.length - this.head;
  }

  private release(): void {
    while (this.head < this.order.length) {
      const first = this.order[this.head]!;
      if (!first.committed || !first.send) break;
      this.head++;
      const same = this.byId.get(first.id)!;
      same.shift();
      if (same.length === 0) this.byId.delete(first.id);
      first.send();
    }
    // Drop released entries now and then, so the array does not grow for ever.
    if (this.head > 1024 && this.head * 2 > this.order.length) {
      this.order.splice(0, this.head);
      this.head = 0;
    }
  }
}
