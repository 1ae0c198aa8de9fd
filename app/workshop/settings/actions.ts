'use server';

import { revalidatePath, updateTag } from 'next/cache';
import { authorizedAction } from '@/lib/auth/action';
import { catalogueTag } from '@/lib/catalogue/cached';
import { dropTags } from '@/lib/drops/catalogue';
import {
  deleteCarrier,
  deleteParcelSize,
  deleteRate,
  deleteZone,
  saveCarrier,
  saveParcelSize,
  saveRate,
  saveZone,
  updateCalendar,
  updateCustoms,
  updateMoney,
  updateStudioDetails,
  type SettingsChange,
} from '@/lib/settings/save';
import {
  calendarSchema,
  carrierSchema,
  customsSchema,
  deleteCarrierSchema,
  deleteParcelSizeSchema,
  deleteRateSchema,
  deleteZoneSchema,
  moneySchema,
  parcelSizeSchema,
  rateSchema,
  studioDetailsSchema,
  zoneSchema,
} from '@/lib/settings/schemas';

// The shop caches pages that show the studio's name, time zone and currency (the home page, each design's page
// and each drop page: lib/catalogue/cached.ts, lib/drops/catalogue.ts). When one of those changes, their tags are
// dropped with `updateTag`, so the next request waits for fresh data (see app/workshop/designs/actions.ts).
// Shipping, tax, card fees, boxes, carriers and customs are read fresh at checkout and in the workshop: nothing
// cached holds them, so those saves only refresh the workshop's own pages.
const shopFacingStudioFields = new Set(['name', 'timeZone', 'currency']);

function settingsChanged(change: SettingsChange): string {
  if (change.changed.some((field) => shopFacingStudioFields.has(field))) {
    updateTag(catalogueTag);
    updateTag(dropTags.all);
  }
  if (change.changed.length > 0) {
    revalidatePath('/workshop/settings');
    revalidatePath('/workshop/plan');
    revalidatePath('/workshop');
  }
  return change.message;
}

export const updateStudioDetailsAction = authorizedAction('owner', studioDetailsSchema, async (input, user) =>
  settingsChanged(await updateStudioDetails(user, input)),
);

export const updateCalendarAction = authorizedAction('owner', calendarSchema, async (input, user) =>
  settingsChanged(await updateCalendar(user, input)),
);

export const updateMoneyAction = authorizedAction('owner', moneySchema, async (input, user) =>
  settingsChanged(await updateMoney(user, input)),
);

export const saveZoneAction = authorizedAction('owner', zoneSchema, async (input, user) =>
  settingsChanged(await saveZone(user, input)),
);

export const deleteZoneAction = authorizedAction('owner', deleteZoneSchema, async (input, user) =>
  settingsChanged(await deleteZone(user, input)),
);

export const saveRateAction = authorizedAction('owner', rateSchema, async (input, user) =>
  settingsChanged(await saveRate(user, input)),
);

export const deleteRateAction = authorizedAction('owner', deleteRateSchema, async (input, user) =>
  settingsChanged(await deleteRate(user, input)),
);

export const saveParcelSizeAction = authorizedAction('owner', parcelSizeSchema, async (input, user) =>
  settingsChanged(await saveParcelSize(user, input)),
);

export const deleteParcelSizeAction = authorizedAction('owner', deleteParcelSizeSchema, async (input, user) =>
  settingsChanged(await deleteParcelSize(user, input)),
);

export const saveCarrierAction = authorizedAction('owner', carrierSchema, async (input, user) =>
  settingsChanged(await saveCarrier(user, input)),
);

export const deleteCarrierAction = authorizedAction('owner', deleteCarrierSchema, async (input, user) =>
  settingsChanged(await deleteCarrier(user, input)),
);

export const updateCustomsAction = authorizedAction('owner', customsSchema, async (input, user) =>
  settingsChanged(await updateCustoms(user, input)),
);
