import {
  DataTypes,
  Model,
  type CreationOptional,
  type ForeignKey,
  type InferAttributes,
  type InferCreationAttributes,
  type NonAttribute,
  type Sequelize,
} from 'sequelize';
import type { Design, DesignStatus } from './design';
import type { Photo } from './photo';

export class Finish extends Model<InferAttributes<Finish>, InferCreationAttributes<Finish>> {
  declare id: CreationOptional<string>;
  declare designId: ForeignKey<Design['id']>;
  declare slug: string;
  declare name: string;
  declare description: CreationOptional<string>;
  /** Added to the design's base price, in the design's minor units. */
  declare priceDifferenceMinor: CreationOptional<number>;
  /** PostgreSQL NUMERIC comes back as a string; kept exact, converted where shown. */
  declare paintHours: CreationOptional<string>;
  declare status: CreationOptional<DesignStatus>;
  declare position: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  declare photos?: NonAttribute<Photo[]>;

  static initModel(sequelize: Sequelize): typeof Finish {
    Finish.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        slug: { type: DataTypes.TEXT, allowNull: false },
        name: { type: DataTypes.TEXT, allowNull: false },
        description: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        priceDifferenceMinor: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        paintHours: { type: DataTypes.DECIMAL(5, 2), allowNull: false, defaultValue: '0' },
        status: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'draft' },
        position: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'finishes', modelName: 'Finish', underscored: true },
    );
    return Finish;
  }
}
