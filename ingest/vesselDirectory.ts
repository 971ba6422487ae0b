import type { Pool } from 'pg';

/**
 * Registered vessel keys → ids, cached. An unknown key triggers a reload at
 * most every `refreshMs`, so a vessel registered while the worker runs is
 * accepted within that time without a query per message.
 */
export class VesselDirectory {
  private ids = new Map<string, number>();
  private loadedAt = 0;

  constructor(
    private readonly pool: Pool,
    private readonly refreshMs = 5_000,
  ) {}

  async idOf(key: string): Promise<number | undefined> {
    const known = this.ids.get(key);
    if (known !== undefined) return known;
    if (Date.now() - this.loadedAt >= this.refreshMs) await this.reload();
    return this.ids.get(key);
  }

  async reload(): Promise<void> {
    const { rows } = await this.pool.query<{ id: number; key: string }>('SELECT id, key FROM vessel');
    this.ids = new Map(rows.map((r) => [r.key, r.id]));
    this.loadedAt = Date.now();
  }
}
