import 'server-only';
import { col, Op, where } from 'sequelize';
import { getDb } from '@/lib/db/connection';
import type { Money } from '@/lib/money';

export type PhotoView = { src: string; alt: string; width: number; height: number };

export type DesignCard = {
  slug: string;
  name: string;
  summary: string;
  /** The lowest price among the design's published finishes. */
  fromPrice: Money;
  finishNames: string[];
  cover: PhotoView | null;
};

// A batch's own photos belong on its drop page; the design's gallery and cover are its standing photos.
// (`batch_id` is read by column: the Photo model does not declare it.)
const standingPhotos = (alias: string) => where(col(`${alias}.batch_id`), Op.is, null);

export type StudioView = { slug: string; name: string; timeZone: string; currency: string };

/** The published designs of the shop's studio with their cheapest finish and cover photo, for the home page. */
export async function listDesignsForHome(): Promise<{ studio: StudioView | null; designs: DesignCard[] }> {
  const { models } = getDb();
  const studio = await models.Studio.findOne({ order: [['createdAt', 'ASC']] });
  if (!studio) return { studio: null, designs: [] };

  const designs = await models.Design.findAll({
    where: { studioId: studio.id, status: 'published' },
    include: [
      { model: models.Finish, as: 'finishes', where: { status: 'published' }, required: true },
      { model: models.Photo, as: 'photos', required: false, where: standingPhotos('photos') },
    ],
    order: [
      ['position', 'ASC'],
      ['name', 'ASC'],
      [{ model: models.Finish, as: 'finishes' }, 'position', 'ASC'],
      [{ model: models.Photo, as: 'photos' }, 'position', 'ASC'],
    ],
  });

  return {
    studio: { slug: studio.slug, name: studio.name, timeZone: studio.timeZone, currency: studio.currency },
    designs: designs.map((design) => {
      const finishes = design.finishes ?? [];
      const cheapest = Math.min(...finishes.map((finish) => finish.priceDifferenceMinor));
      const cover = design.photos?.[0];
      return {
        slug: design.slug,
        name: design.name,
        summary: design.summary,
        fromPrice: { amountMinor: design.basePriceMinor + cheapest, currency: design.currency },
        finishNames: finishes.map((finish) => finish.name),
        cover: cover ? { src: cover.src, alt: cover.alt, width: cover.width, height: cover.height } : null,
      };
    }),
  };
}

export type FinishView = {
  slug: string;
  name: string;
  description: string;
  price: Money;
  paintHours: number;
  photos: PhotoView[];
};

export type DesignDetail = {
  slug: string;
  name: string;
  summary: string;
  story: string;
  materials: string;
  care: string;
  fit: {
    widthMm: number | null;
    heightMm: number | null;
    depthMm: number | null;
    weightG: number | null;
    eyeOpeningWidthMm: number | null;
    eyeSpacingMm: number | null;
  };
  finishes: FinishView[];
  studio: StudioView;
};

/** One published design with its published finishes and their photos, or null when there is none. */
export async function getPublishedDesignBySlug(slug: string): Promise<DesignDetail | null> {
  const { models } = getDb();
  const design = await models.Design.findOne({
    where: { slug, status: 'published' },
    include: [
      { model: models.Studio, as: 'studio', required: true },
      {
        model: models.Finish,
        as: 'finishes',
        where: { status: 'published' },
        required: true,
        include: [{ model: models.Photo, as: 'photos', required: false, where: standingPhotos('finishes->photos') }],
      },
    ],
    order: [
      [{ model: models.Finish, as: 'finishes' }, 'position', 'ASC'],
      [{ model: models.Finish, as: 'finishes' }, { model: models.Photo, as: 'photos' }, 'position', 'ASC'],
    ],
  });
  if (!design?.studio) return null;

  const { studio } = design;
  return {
    slug: design.slug,
    name: design.name,
    summary: design.summary,
    story: design.story,
    materials: design.materials,
    care: design.care,
    fit: {
      widthMm: design.widthMm,
      heightMm: design.heightMm,
      depthMm: design.depthMm,
      weightG: design.weightG,
      eyeOpeningWidthMm: design.eyeOpeningWidthMm ?? null,
      eyeSpacingMm: design.eyeSpacingMm ?? null,
    },
    studio: { slug: studio.slug, name: studio.name, timeZone: studio.timeZone, currency: studio.currency },
    finishes: (design.finishes ?? []).map((finish) => ({
      slug: finish.slug,
      name: finish.name,
      description: finish.description,
      price: { amountMinor: design.basePriceMinor + finish.priceDifferenceMinor, currency: design.currency },
      paintHours: Number(finish.paintHours),
      photos: (finish.photos ?? []).map(({ src, alt, width, height }) => ({ src, alt, width, height })),
    })),
  };
}
