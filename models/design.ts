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
import type { Finish } from './finish';
import type { Photo } from './photo';
import type { Studio } from './studio';

export const designStatuses = ['draft', 'published', 'retired'] as const;
export type DesignStatus = (typeof designStatuses)[number];

export class Design extends Model<InferAttributes<Design>, InferCreationAttributes<Design>> {
  declare id: CreationOptional<string>;
  declare studioId: ForeignKey<Studio['id']>;
  declare slug: string;
  declare name: string;
  declare summary: CreationOptional<string>;
  declare story: CreationOptional<string>;
  /** Price of the plainest finish, in minor units of `currency`. */
  declare basePriceMinor: number;
  declare currency: string;
  declare status: CreationOptional<DesignStatus>;
  declare widthMm: number | null;
  declare heightMm: number | null;
  declare depthMm: number | null;
  declare weightG: number | null;
  declare eyeOpeningWidthMm: CreationOptional<number | null>;
  declare eyeSpacingMm: CreationOptional<number | null>;
  declare materials: CreationOptional<string>;
  declare care: CreationOptional<string>;
  declare position: CreationOptional<number>;
  declare publishedAt: Date | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  declare studio?: NonAttribute<Studio>;
  declare finishes?: NonAttribute<Finish[]>;
  declare photos?: NonAttribute<Photo[]>;

  static initModel(sequelize: Sequelize): typeof Design {
    Design.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        slug: { type: DataTypes.TEXT, allowNull: false },
        name: { type: DataTypes.TEXT, allowNull: false },
        summary: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        story: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        basePriceMinor: { type: DataTypes.INTEGER, allowNull: false },
        currency: { type: DataTypes.CHAR(3), allowNull: false },
        status: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'draft' },
        widthMm: { type: DataTypes.INTEGER, allowNull: true },
        heightMm: { type: DataTypes.INTEGER, allowNull: true },
        depthMm: { type: DataTypes.INTEGER, allowNull: true },
        weightG: { type: DataTypes.INTEGER, allowNull: true },
        eyeOpeningWidthMm: { type: DataTypes.INTEGER, allowNull: true },
        eyeSpacingMm: { type: DataTypes.INTEGER, allowNull: true },
        materials: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        care: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        position: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        publishedAt: { type: DataTypes.DATE, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'designs', modelName: 'Design', underscored: true },
    );
    return Design;
  }
}
