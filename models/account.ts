import {
  DataTypes,
  Model,
  type CreationOptional,
  type ForeignKey,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';
import type { User } from './user';

export class Account extends Model<InferAttributes<Account>, InferCreationAttributes<Account>> {
  declare id: CreationOptional<string>;
  declare userId: ForeignKey<User['id']>;
  declare type: string;
  declare provider: string;
  declare providerAccountId: string;
  declare refreshToken: string | null;
  declare accessToken: string | null;
  declare expiresAt: number | null;
  declare tokenType: string | null;
  declare scope: string | null;
  declare idToken: string | null;
  declare sessionState: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): typeof Account {
    Account.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        type: { type: DataTypes.TEXT, allowNull: false },
        provider: { type: DataTypes.TEXT, allowNull: false },
        providerAccountId: { type: DataTypes.TEXT, allowNull: false },
        refreshToken: DataTypes.TEXT,
        accessToken: DataTypes.TEXT,
        expiresAt: DataTypes.INTEGER,
        tokenType: DataTypes.TEXT,
        scope: DataTypes.TEXT,
        idToken: DataTypes.TEXT,
        sessionState: DataTypes.TEXT,
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'accounts', modelName: 'Account', underscored: true },
    );
    return Account;
  }
}
