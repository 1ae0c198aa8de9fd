'use strict';

const catalogue = require('./support/demo-catalogue.cjs');
const { renderDemoArt, PHOTO_WIDTH, PHOTO_HEIGHT } = require('./support/render-demo-art.cjs');

/** The invented demo studio, its designs, finishes and photos. For the demo and tests only. */
module.exports = {
  async up(queryInterface) {
    await renderDemoArt();
    const now = new Date();
    const stamp = { created_at: now, updated_at: now };

    await queryInterface.sequelize.transaction(async (transaction) => {
      const [[studio]] = await queryInterface.sequelize.query(
        `INSERT INTO studios (slug, name, time_zone, currency, country)
         VALUES (:slug, :name, :time_zone, :currency, :country) RETURNING id`,
        { replacements: catalogue.studio, transaction },
      );

      for (const design of catalogue.designs) {
        const [[{ id: designId }]] = await queryInterface.sequelize.query(
          `INSERT INTO designs (studio_id, slug, name, summary, story, base_price_minor, currency, status,
             width_mm, height_mm, depth_mm, weight_g, materials, care, position, published_at)
           VALUES (:studioId, :slug, :name, :summary, :story, :base_price_minor, :currency, :status,
             :width_mm, :height_mm, :depth_mm, :weight_g, :materials, :care, :position, :published_at)
           RETURNING id`,
          {
            replacements: {
              ...design,
              studioId: studio.id,
              currency: catalogue.studio.currency,
              materials: catalogue.materials,
              care: catalogue.care,
              published_at: design.status === 'published' ? now : null,
            },
            transaction,
          },
        );

        for (const [position, finishSlug] of design.finishes.entries()) {
          const finish = catalogue.finishes[finishSlug];
          const status = design.draftFinishes?.includes(finishSlug) ? 'draft' : 'published';
          const [[{ id: finishId }]] = await queryInterface.sequelize.query(
            `INSERT INTO finishes (design_id, slug, name, description, price_difference_minor, paint_hours,
               status, position)
             VALUES (:designId, :slug, :name, :description, :price_difference_minor, :paint_hours, :status,
               :position) RETURNING id`,
            { replacements: { ...finish, designId, slug: finishSlug, status, position }, transaction },
          );

          await queryInterface.bulkInsert(
            'photos',
            catalogue.views.map(({ view, label }, index) => ({
              design_id: designId,
              finish_id: finishId,
              src: `/media/demo/${catalogue.photoFileName(design.slug, finishSlug, view)}`,
              alt: `${design.name} mask in the ${finish.name} finish, ${label}.`,
              width: PHOTO_WIDTH,
              height: PHOTO_HEIGHT,
              position: position * catalogue.views.length + index,
              ...stamp,
            })),
            { transaction },
          );
        }
      }
    });
  },

  async down(queryInterface) {
    // Designs, finishes and photos go with the studio (ON DELETE CASCADE).
    await queryInterface.bulkDelete('studios', { slug: catalogue.studio.slug });
  },
};
