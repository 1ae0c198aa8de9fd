import type { IsoDate } from './calendar';

/**
 * Where "Open a batch with this plan" goes: the new-batch page with the design, the ship-by date and a
 * quantity per finish (`qty.<finishId>=<n>`, finishes with none left out).
 */
export function openBatchHref(plan: { designSlug: string; shipBy: IsoDate; quantities: { finishId: string; quantity: number }[] }): string {
  const query = new URLSearchParams({ design: plan.designSlug, shipBy: plan.shipBy });
  for (const { finishId, quantity } of plan.quantities) if (quantity > 0) query.append(`qty.${finishId}`, String(quantity));
  return `/workshop/batches/new?${query.toString()}`;
}
