'use strict';

/**
 * What an uploaded photo needs beyond `src`: the files written for it (every width in WebP and AVIF,
 * paths relative to MEDIA_DIR), a tiny blurred placeholder, the uploaded file's size and its key at the
 * upload service. The demo's seeded photos (public/media/demo) keep an empty list and no key.
 * `source_key` is unique so a callback delivered twice stores one photo.
 */
module.exports = {
  async up(queryInterface, Sequelize) {
    await queryInterface.sequelize.transaction(async (transaction) => {
      await queryInterface.addColumn(
        'photos',
        'renditions',
        { type: Sequelize.JSONB, allowNull: false, defaultValue: Sequelize.literal(`'[]'::jsonb`) },
        { transaction },
      );
      await queryInterface.addColumn('photos', 'blur_data_url', { type: Sequelize.TEXT, allowNull: true }, { transaction });
      await queryInterface.addColumn('photos', 'bytes', { type: Sequelize.INTEGER, allowNull: true }, { transaction });
      await queryInterface.addColumn('photos', 'source_key', { type: Sequelize.TEXT, allowNull: true }, { transaction });
      await queryInterface.sequelize.query(
        `ALTER TABLE photos
           ADD CONSTRAINT photos_renditions_list CHECK (jsonb_typeof(renditions) = 'array'),
           ADD CONSTRAINT photos_blur_data_url_image CHECK (blur_data_url IS NULL OR blur_data_url ~ '^data:image/(webp|png|jpeg);base64,[A-Za-z0-9+/=]+$'),
           ADD CONSTRAINT photos_bytes_positive CHECK (bytes IS NULL OR bytes > 0),
           ADD CONSTRAINT photos_source_key_present CHECK (source_key IS NULL OR length(source_key) BETWEEN 1 AND 200),
           ADD CONSTRAINT photos_uploaded_complete CHECK (source_key IS NULL OR (jsonb_array_length(renditions) > 0 AND bytes IS NOT NULL AND blur_data_url IS NOT NULL))`,
        { transaction },
      );
      await queryInterface.addIndex('photos', ['source_key'], {
        name: 'photos_source_key_unique',
        unique: true,
        where: { source_key: { [Sequelize.Op.ne]: null } },
        transaction,
      });
    });
  },

  async down(queryInterface) {
    await queryInterface.sequelize.transaction(async (transaction) => {
      await queryInterface.removeIndex('photos', 'photos_source_key_unique', { transaction });
      await queryInterface.sequelize.query(
        `ALTER TABLE photos
           DROP CONSTRAINT photos_uploaded_complete,
           DROP CONSTRAINT photos_source_key_present,
           DROP CONSTRAINT photos_bytes_positive,
           DROP CONSTRAINT photos_blur_data_url_image,
           DROP CONSTRAINT photos_renditions_list`,
        { transaction },
      );
      await queryInterface.removeColumn('photos', 'source_key', { transaction });
      await queryInterface.removeColumn('photos', 'bytes', { transaction });
      await queryInterface.removeColumn('photos', 'blur_data_url', { transaction });
      await queryInterface.removeColumn('photos', 'renditions', { transaction });
    });
  },
};
