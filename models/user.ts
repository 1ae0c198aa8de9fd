import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';

import type { Role } from '@/lib/auth/roles';

export class User extends Model<InferAttributes<User>, InferCreationAttributes<User>> {
  declare id: CreationOptional<string>;
  declare name: string | null;
  /** Normalised: trimmed and lower-case (lib/auth/email-address.ts). */
  declare email: string;
  declare emailVerified: Date | null;
  declare image: CreationOptional<string | null>;
  declare role: CreationOptional<Role>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): typeof User {
    User.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        name: { type: DataTypes.TEXT, allowNull: true },
        email: { type: DataTypes.TEXT, allowNull: false },
        emailVerified: { type: DataTypes.DATE, allowNull: true },
        image: { type: DataTypes.TEXT, allowNull: true },
        role: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'customer' },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'users', modelName: 'User', underscored: true },
    );
    return User;
  }
}
