import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';

export class VerificationToken extends Model<
  InferAttributes<VerificationToken>,
  InferCreationAttributes<VerificationToken>
> {
  declare identifier: string;
  /** SHA-256 of the link's secret: the secret itself is only ever in the e-mail. */
  declare token: string;
  declare expires: Date;
  declare usedAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): typeof VerificationToken {
    VerificationToken.init(
      {
        identifier: { type: DataTypes.TEXT, primaryKey: true },
        token: { type: DataTypes.TEXT, primaryKey: true },
        expires: { type: DataTypes.DATE, allowNull: false },
        usedAt: { type: DataTypes.DATE, allowNull: true },
        createdAt: DataTypes.DATE,
      },
      {
        sequelize,
        tableName: 'verification_tokens',
        modelName: 'VerificationToken',
        underscored: true,
        updatedAt: false,
      },
    );
    return VerificationToken;
  }
}
