import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';

export class Studio extends Model<InferAttributes<Studio>, InferCreationAttributes<Studio>> {
  declare id: CreationOptional<string>;
  declare slug: string;
  declare name: string;
  /** IANA zone the studio plans its drops in, e.g. Europe/Dublin. */
  declare timeZone: string;
  /** ISO 4217 code of the studio's prices. */
  declare currency: string;
  /** ISO 3166-1 alpha-2 code of the country the studio ships from. */
  declare country: string;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): typeof Studio {
    Studio.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        slug: { type: DataTypes.TEXT, allowNull: false },
        name: { type: DataTypes.TEXT, allowNull: false },
        timeZone: { type: DataTypes.TEXT, allowNull: false },
        currency: { type: DataTypes.CHAR(3), allowNull: false },
        country: { type: DataTypes.CHAR(2), allowNull: false },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'studios', modelName: 'Studio', underscored: true },
    );
    return Studio;
  }
}
