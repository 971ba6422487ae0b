import type { PrismaClient } from '../db/prisma';

/**
 * A shore engineer works a flag through its lifecycle (metrics-v1 "Trend
 * flags"): open → acknowledged (who, when, note) → closed (resolved or
 * dismissed, who, when, note). Each step is one conditional UPDATE, so two
 * people acting on the same flag at once cannot both succeed, and a flag is
 * never moved backwards. The flag job owns opening flags; this owns the
 * people's side (the watchlist's server actions and `holdfast flags`).
 *
 * Until users exist (the access-control issue), `by` is the name typed in
 * the form ("shore engineer" when left empty): recorded, not verified.
 */
export type TransitionResult = 'done' | 'not_found' | 'wrong_status';

export const CLOSE_REASONS = ['resolved', 'dismissed'] as const;
export type CloseReason = (typeof CLOSE_REASONS)[number];

async function outcome(prisma: PrismaClient, id: bigint, updated: number): Promise<TransitionResult> {
  if (updated === 1) return 'done';
  return (await prisma.flag.count({ where: { id } })) === 0 ? 'not_found' : 'wrong_status';
}

export async function acknowledgeFlag(
  prisma: PrismaClient,
  input: { id: bigint; by: string; note: string; at?: Date },
): Promise<TransitionResult> {
  const at = input.at ?? new Date();
  const { count } = await prisma.flag.updateMany({
    where: { id: input.id, status: 'open' },
    data: { status: 'acknowledged', acknowledgedBy: input.by, acknowledgedAt: at, acknowledgeNote: input.note, updatedAt: at },
  });
  return outcome(prisma, input.id, count);
}

export async function closeFlag(
  prisma: PrismaClient,
  input: { id: bigint; by: string; reason: CloseReason; note: string; at?: Date },
): Promise<TransitionResult> {
  const at = input.at ?? new Date();
  const { count } = await prisma.flag.updateMany({
    where: { id: input.id, status: { in: ['open', 'acknowledged'] } },
    data: { status: 'closed', closedBy: input.by, closedAt: at, closeReason: input.reason, closeNote: input.note, updatedAt: at },
  });
  return outcome(prisma, input.id, count);
}
