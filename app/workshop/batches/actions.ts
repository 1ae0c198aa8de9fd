'use server';

import { revalidatePath, updateTag } from 'next/cache';
import { redirect } from 'next/navigation';
import { authorizedAction } from '@/lib/auth/action';
import { catalogueTag } from '@/lib/catalogue/cached';
import { batchFormSchema, cancelBatchSchema } from '@/lib/drops/batch-schemas';
import { cancelBatch, saveBatch } from '@/lib/drops/batches';
import { dropTags } from '@/lib/drops/catalogue';

function refreshShop(batchId: string) {
  // The home page, the design's page and the drop page read batches from Next's data cache. `updateTag`
  // expires them outright (not stale-while-revalidate), so the maker's next look at the shop shows the change.
  updateTag(dropTags.all);
  updateTag(dropTags.batch(batchId));
  updateTag(catalogueTag);
  revalidatePath('/workshop/batches');
}

export const saveBatchAction = authorizedAction('owner', batchFormSchema, async (input, user) => {
  const result = await saveBatch(user, input);
  refreshShop(result.batchId);
  if (!input.batchId) {
    redirect(`/workshop/batches/${result.batchId}?saved=${result.status}${result.warning ? '&warning=ship-by' : ''}`);
  }
  return result.warning ? `${result.message} Note: ${result.warning}` : result.message;
});

export const cancelBatchAction = authorizedAction('owner', cancelBatchSchema, async (input, user) => {
  const { name, releasedHolds } = await cancelBatch(user, input.batchId);
  refreshShop(input.batchId);
  return `${name} is cancelled${releasedHolds ? `; ${releasedHolds} running hold(s) were let go` : ''}. The drop page says so.`;
});
