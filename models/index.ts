import type { Sequelize } from 'sequelize';
import { Design } from './design';
import { Finish } from './finish';
import { Photo } from './photo';
import { Studio } from './studio';
import { Account } from './account';
import { Batch } from './batch';
import { AuthSession } from './auth-session';
import { User } from './user';
import { VerificationToken } from './verification-token';

export { Account, AuthSession, Batch, Design, Finish, Photo, Studio, User, VerificationToken };
export { designStatuses, type DesignStatus } from './design';
export { batchStatuses, type BatchStatus } from './batch';

/** Binds every model to one connection and declares how they relate. Call once per Sequelize instance. */
export function initModels(sequelize: Sequelize) {
  Studio.initModel(sequelize);
  Design.initModel(sequelize);
  Finish.initModel(sequelize);
  Photo.initModel(sequelize);
  User.initModel(sequelize);
  Account.initModel(sequelize);
  AuthSession.initModel(sequelize);
  VerificationToken.initModel(sequelize);
  Batch.initModel(sequelize);

  Studio.hasMany(Design, { foreignKey: 'studioId', as: 'designs' });
  Design.belongsTo(Studio, { foreignKey: 'studioId', as: 'studio' });
  Design.hasMany(Finish, { foreignKey: 'designId', as: 'finishes' });
  Finish.belongsTo(Design, { foreignKey: 'designId', as: 'design' });
  Design.hasMany(Photo, { foreignKey: 'designId', as: 'photos' });
  Finish.hasMany(Photo, { foreignKey: 'finishId', as: 'photos' });
  Photo.belongsTo(Design, { foreignKey: 'designId', as: 'design' });
  Photo.belongsTo(Finish, { foreignKey: 'finishId', as: 'finish' });

  User.hasMany(Account, { foreignKey: 'userId', as: 'accounts' });
  Account.belongsTo(User, { foreignKey: 'userId', as: 'user' });
  User.hasMany(AuthSession, { foreignKey: 'userId', as: 'sessions' });
  AuthSession.belongsTo(User, { foreignKey: 'userId', as: 'user' });

  Design.hasMany(Batch, { foreignKey: 'designId', as: 'batches' });
  Batch.belongsTo(Design, { foreignKey: 'designId', as: 'design' });

  return { Studio, Design, Finish, Photo, User, Account, AuthSession, VerificationToken, Batch };
}

export type Models = ReturnType<typeof initModels>;
