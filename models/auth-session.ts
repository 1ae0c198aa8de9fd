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
import type { User } from './user';

/** A signed-in session (named apart from Sequelize's own "session" vocabulary). */
export class AuthSession extends Model<InferAttributes<AuthSession>, InferCreationAttributes<AuthSession>> {
  declare id: CreationOptional<string>;
  declare sessionToken: string;
  declare userId: ForeignKey<User['id']>;
  declare expires: Date;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  declare user?: NonAttribute<User>;

  static initModel(sequelize: Sequelize): typeof AuthSession {
    AuthSession.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        sessionToken: { type: DataTypes.TEXT, allowNull: false },
        expires: { type: DataTypes.DATE, allowNull: false },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'sessions', modelName: 'AuthSession', underscored: true },
    );
    return AuthSession;
  }
}
