// Plain data and rules, safe to import anywhere (client components and unit tests included).
import { hasRole, type Role } from '@/lib/auth/roles';

export const lineStages = ['to_cast', 'cast', 'trimmed', 'painted', 'packed', 'shipped', 'failed_casting', 'failed_paint'] as const;
export type LineStage = (typeof lineStages)[number];

/** A mask's way through the workshop, in order. */
export const flowStages = ['to_cast', 'cast', 'trimmed', 'painted', 'packed', 'shipped'] as const satisfies readonly LineStage[];
/** The stages the production board moves masks to by stepping; shipping sets `shipped` itself. */
export const boardStages = ['to_cast', 'cast', 'trimmed', 'painted', 'packed'] as const satisfies readonly LineStage[];
export type BoardStage = (typeof boardStages)[number];
export const failedStages = ['failed_casting', 'failed_paint'] as const satisfies readonly LineStage[];
export type FailedStage = (typeof failedStages)[number];

export const stageLabels: Record<LineStage, string> = {
  to_cast: 'To cast',
  cast: 'Cast',
  trimmed: 'Trimmed',
  painted: 'Painted',
  packed: 'Packed',
  shipped: 'Shipped',
  failed_casting: 'Failed casting',
  failed_paint: 'Failed paint',
};

export const isFailed = (stage: LineStage): stage is FailedStage => (failedStages as readonly LineStage[]).includes(stage);
const flowIndex = (stage: LineStage) => (flowStages as readonly LineStage[]).indexOf(stage);

/** The stage the board offers next, or null where the board stops (packed waits for shipping; failed for the owner). */
export function nextStage(stage: LineStage): BoardStage | null {
  const index = flowIndex(stage);
  return index >= 0 && index < boardStages.length - 1 ? boardStages[index + 1]! : null;
}

/** One step back, to fix a mistake; nothing before to_cast, and nothing out of shipped or a failure. */
export function previousStage(stage: LineStage): BoardStage | null {
  const index = flowIndex(stage);
  return index > 0 && stage !== 'shipped' ? boardStages[index - 1]! : null;
}

/** How a mask at this stage can fail: in the mold (before trimming) or in paint; null once it is packed. */
export function failureFor(stage: LineStage): FailedStage | null {
  if (stage === 'to_cast' || stage === 'cast') return 'failed_casting';
  if (stage === 'trimmed' || stage === 'painted') return 'failed_paint';
  return null;
}

export type MoveKind = 'forward' | 'back' | 'fail' | 'recast';
export type MoveRefusal =
  | 'not_staff'
  | 'refunded'
  | 'oversold_open'
  | 'same_stage'
  | 'shipping_step'
  | 'already_shipped'
  | 'owner_only'
  | 'wrong_failure'
  | 'failed_goes_to_cast'
  | 'skips_stages';
export type MoveCheck = { ok: true; kind: MoveKind } | { ok: false; reason: MoveRefusal; message: string };

export type LineFlags = { refunded?: boolean; oversoldOpen?: boolean };

const refuse = (reason: MoveRefusal, message: string): MoveCheck => ({ ok: false, reason, message });
/** A stage named in a sentence: “Trimmed”. */
export const quoteStage = (stage: LineStage) => `“${stageLabels[stage]}”`;

/**
 * May a person with `role` move a mask from `from` to `to`? Studio hands step masks one stage forward
 * (or one back to fix a slip); only the owner marks a mask failed or sends a failed one back for a spare
 * pull. Shipping is its own step, and refunded or undecided oversold masks stay where they are.
 */
export function checkMove(from: LineStage, to: LineStage, role: Role, flags: LineFlags = {}): MoveCheck {
  if (!hasRole(role, 'staff')) return refuse('not_staff', 'Only the studio moves masks through production.');
  if (flags.refunded) return refuse('refunded', 'This mask is refunded, so it is not made any more.');
  if (flags.oversoldOpen) {
    return refuse('oversold_open', 'This mask was oversold: the owner must refund it or confirm an extra cast before it is made.');
  }
  if (from === to) return refuse('same_stage', `This mask is already at ${quoteStage(to)}.`);
  if (from === 'shipped') return refuse('already_shipped', 'This mask has shipped; it cannot be moved back.');
  if (to === 'shipped') return refuse('shipping_step', 'Masks are marked shipped when they are sent, not from the production board.');

  if (isFailed(to)) {
    if (failureFor(from) !== to) {
      const right = failureFor(from);
      return refuse(
        'wrong_failure',
        right
          ? `A mask at ${quoteStage(from)} can only be marked ${quoteStage(right)}.`
          : `A mask at ${quoteStage(from)} cannot be marked failed.`,
      );
    }
    return hasRole(role, 'owner') ? { ok: true, kind: 'fail' } : refuse('owner_only', 'Only the owner marks a mask as failed.');
  }
  if (isFailed(from)) {
    if (to !== 'to_cast') return refuse('failed_goes_to_cast', `A failed mask goes back to ${quoteStage('to_cast')} for a spare pull first.`);
    return hasRole(role, 'owner') ? { ok: true, kind: 'recast' } : refuse('owner_only', 'Only the owner sends a failed mask back for a spare pull.');
  }

  if (nextStage(from) === to) return { ok: true, kind: 'forward' };
  if (previousStage(from) === to) return { ok: true, kind: 'back' };
  const next = nextStage(from);
  return refuse(
    'skips_stages',
    next
      ? `Masks move one stage at a time: after ${quoteStage(from)} comes ${quoteStage(next)}.`
      : `A mask at ${quoteStage(from)} waits for shipping; it can only go back to ${quoteStage(previousStage(from) ?? from)}.`,
  );
}
