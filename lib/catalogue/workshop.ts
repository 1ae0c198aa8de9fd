import 'server-only';
import { getDb } from '@/lib/db/connection';
import type { DesignStatus } from '@/models';

export type WorkshopDesignRow = {
  slug: string;
  name: string;
  status: DesignStatus;
  finishes: { name: string; status: DesignStatus }[];
  photoCount: number;
};

/** Every design of the studio, drafts included, for the workshop's overview. */
export async function listDesignsForWorkshop(): Promise<WorkshopDesignRow[]> {
  const { models } = getDb();
  const designs = await models.Design.findAll({
    include: [
      { model: models.Finish, as: 'finishes', required: false },
      { model: models.Photo, as: 'photos', required: false, attributes: ['id'] },
    ],
    order: [
      ['position', 'ASC'],
      ['name', 'ASC'],
      [{ model: models.Finish, as: 'finishes' }, 'position', 'ASC'],
    ],
  });
  return designs.map((design) => ({
    slug: design.slug,
    name: design.name,
    status: design.status,
    finishes: (design.finishes ?? []).map((f) => ({ name: f.name, status: f.status })),
    photoCount: design.photos?.length ?? 0,
  }));
}
