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
import type { Design } from './design';

export const batchStatuses = ['draft', 'scheduled', 'cancelled'] as const;
export type BatchStatus = (typeof batchStatuses)[number];

export class Batch extends Model<InferAttributes<Batch>, InferCreationAttributes<Batch>> {
  declare id: CreationOptional<string>;
  declare designId: ForeignKey<Design['id']>;
  declare name: string;
  declare status: CreationOptional<BatchStatus>;
  declare perBuyerLimit: CreationOptional<number>;
  declare holdMinutes: CreationOptional<number>;
  declare earlyAccessAt: Date | null;
  declare opensAt: Date;
  declare closesAt: Date;
  /** A calendar date (YYYY-MM-DD) in the studio's zone. */
  declare shipBy: string;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  declare design?: NonAttribute<Design>;

  static initModel(sequelize: Sequelize): typeof Batch {
    Batch.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        name: { type: DataTypes.TEXT, allowNull: false },
        status: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'draft' },
        perBuyerLimit: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
        holdMinutes: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 10 },
        earlyAccessAt: { type: DataTypes.DATE, allowNull: true },
        opensAt: { type: DataTypes.DATE, allowNull: false },
        closesAt: { type: DataTypes.DATE, allowNull: false },
        shipBy: { type: DataTypes.DATEONLY, allowNull: false },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'batches', modelName: 'Batch', underscored: true },
    );
    return Batch;
  }
}
