'use server';

import { revalidatePath, updateTag } from 'next/cache';
import { redirect } from 'next/navigation';
import { authorizedAction } from '@/lib/auth/action';
import { catalogueTag } from '@/lib/catalogue/cached';
import { dropTags } from '@/lib/drops/catalogue';
import { removePhotoFiles } from '@/lib/photos';
import {
  addFinish,
  createDesign,
  deletePhotoRecord,
  designFormSchema,
  designStatusSchema,
  designUpdateSchema,
  finishFormSchema,
  finishStatusSchema,
  finishUpdateSchema,
  movePhoto,
  photoAltSchema,
  photoIdSchema,
  photoMoveSchema,
  setDesignStatus,
  setFinishStatus,
  updateDesign,
  updateFinish,
  updatePhotoAlt,
  type CatalogueChange,
} from '@/lib/catalogue/editing';

// Every change drops the shop's cached catalogue at once. `updateTag` rather than `revalidateTag(…, 'max')`:
// inside a server action it expires the entries immediately, so the next shop request (the maker checking
// their change, or a buyer) waits for fresh data instead of being served the stale page once
// (node_modules/next/dist/docs/01-app/03-api-reference/04-functions/updateTag.md). Drop pages show a
// design's name, prices and photos too, and vanish with it, so their cache goes as well.
function catalogueChanged({ slugs }: Pick<CatalogueChange, 'slugs'>) {
  updateTag(catalogueTag);
  updateTag(dropTags.all);
  for (const slug of new Set(slugs)) {
    updateTag(`design:${slug}`);
    revalidatePath(`/workshop/designs/${slug}`);
  }
  revalidatePath('/workshop/designs');
  revalidatePath('/workshop');
}

export const createDesignAction = authorizedAction('owner', designFormSchema, async (input) => {
  const change = await createDesign(input);
  catalogueChanged(change);
  redirect(`/workshop/designs/${change.slug}?done=created`);
});

export const updateDesignAction = authorizedAction('owner', designUpdateSchema, async (input, user) => {
  const change = await updateDesign(user, input);
  catalogueChanged(change);
  // A new slug is a new address: carry on editing there.
  if (change.slug !== change.previousSlug) redirect(`/workshop/designs/${change.slug}?done=moved`);
  return `${change.designName} is saved.`;
});

export const setDesignStatusAction = authorizedAction('owner', designStatusSchema, async (input, user) => {
  const change = await setDesignStatus(user, input);
  catalogueChanged(change);
  if (change.status === 'published') return `${change.designName} is published: buyers can see it in the shop now.`;
  if (change.status === 'retired') return `${change.designName} is retired: the shop no longer shows it.`;
  return `${change.designName} is a draft again. Buyers do not see it.`;
});

export const addFinishAction = authorizedAction('owner', finishFormSchema, async (input) => {
  const change = await addFinish(input);
  catalogueChanged(change);
  return `${change.finishName} is added as a draft. Publish it when its photos are in.`;
});

export const updateFinishAction = authorizedAction('owner', finishUpdateSchema, async (input, user) => {
  const change = await updateFinish(user, input);
  catalogueChanged(change);
  return `${change.finishName} is saved.`;
});

export const setFinishStatusAction = authorizedAction('owner', finishStatusSchema, async (input, user) => {
  const change = await setFinishStatus(user, input);
  catalogueChanged(change);
  if (change.status === 'published') {
    return change.designStatus === 'published'
      ? `${change.finishName} is published: buyers can choose it now.`
      : `${change.finishName} is published. It shows in the shop once ${change.designName} is published.`;
  }
  if (change.status === 'retired') return `${change.finishName} is retired: buyers can no longer choose it.`;
  return `${change.finishName} is a draft again.`;
});

export const updatePhotoAltAction = authorizedAction('owner', photoAltSchema, async (input) => {
  const change = await updatePhotoAlt(input);
  catalogueChanged(change);
  return 'The description is saved.';
});

export const movePhotoAction = authorizedAction('owner', photoMoveSchema, async (input) => {
  const change = await movePhoto(input);
  catalogueChanged(change);
  if (!change.moved) return input.direction === 'up' ? 'The photo is already first.' : 'The photo is already last.';
  return input.direction === 'up' ? 'The photo moved up.' : 'The photo moved down.';
});

// Not lib/photos' `deletePhoto`: that deletes the row in a transaction of its own, where the rule that a
// design in the shop keeps a photo cannot be checked. Here the row goes, the rule is checked, and the
// files are removed (`removePhotoFiles`, made for this) in one transaction.
export const deletePhotoAction = authorizedAction('owner', photoIdSchema, async (input) => {
  const change = await deletePhotoRecord(input.photoId, removePhotoFiles);
  catalogueChanged(change);
  return 'The photo is deleted.';
});
