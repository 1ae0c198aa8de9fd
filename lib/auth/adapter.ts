import 'server-only';
import type { Adapter, AdapterAccount, AdapterSession, AdapterUser, VerificationToken } from 'next-auth/adapters';
import { Op } from 'sequelize';
import { getDb } from '@/lib/db/connection';
import type { Role } from '@/lib/auth/roles';
import type { AuthSession, User } from '@/models';

export type DemoldAdapterUser = AdapterUser & { role: Role };

function toAdapterUser(user: User): DemoldAdapterUser {
  return {
    id: user.id,
    name: user.name,
    email: user.email,
    emailVerified: user.emailVerified,
    image: user.image ?? null,
    role: user.role,
  };
}

function toAdapterSession(session: AuthSession): AdapterSession {
  return { sessionToken: session.sessionToken, userId: session.userId, expires: session.expires };
}

/**
 * next-auth's storage on our own Sequelize models: users with their role, database sessions, and
 * single-use sign-in links that keep a trace once used.
 */
export function demoldAdapter(): Adapter {
  const models = () => getDb().models;
  return {
    async createUser(data: Omit<AdapterUser, 'id'>) {
      const user = await models().User.create({
        email: data.email,
        name: data.name ?? null,
        emailVerified: data.emailVerified ?? null,
        image: data.image ?? null,
      });
      return toAdapterUser(user);
    },
    async getUser(id) {
      const user = await models().User.findByPk(id);
      return user ? toAdapterUser(user) : null;
    },
    async getUserByEmail(email) {
      const user = await models().User.findOne({ where: { email } });
      return user ? toAdapterUser(user) : null;
    },
    async getUserByAccount({ provider, providerAccountId }) {
      const account = await models().Account.findOne({
        where: { provider, providerAccountId },
        include: [{ model: models().User, as: 'user', required: true }],
      });
      const user = (account as unknown as { user?: User } | null)?.user;
      return user ? toAdapterUser(user) : null;
    },
    async updateUser({ id, ...changes }) {
      const user = await models().User.findByPk(id, { rejectOnEmpty: true });
      // Only what next-auth itself maintains; roles change through lib/auth/people.ts alone.
      if (changes.emailVerified !== undefined) user.emailVerified = changes.emailVerified;
      if (changes.name !== undefined) user.name = changes.name;
      if (changes.image !== undefined) user.image = changes.image;
      await user.save();
      return toAdapterUser(user);
    },
    async deleteUser(id) {
      await models().User.destroy({ where: { id } });
    },
    async linkAccount(account: AdapterAccount) {
      await models().Account.create({
        userId: account.userId,
        type: account.type,
        provider: account.provider,
        providerAccountId: account.providerAccountId,
        refreshToken: account.refresh_token ?? null,
        accessToken: account.access_token ?? null,
        expiresAt: account.expires_at ?? null,
        tokenType: account.token_type ?? null,
        scope: account.scope ?? null,
        idToken: account.id_token ?? null,
        sessionState: typeof account.session_state === 'string' ? account.session_state : null,
      });
      return account;
    },
    async unlinkAccount({ provider, providerAccountId }: Pick<AdapterAccount, 'provider' | 'providerAccountId'>) {
      await models().Account.destroy({ where: { provider, providerAccountId } });
    },
    async createSession(data) {
      const session = await models().AuthSession.create(data);
      return toAdapterSession(session);
    },
    async getSessionAndUser(sessionToken) {
      const session = await models().AuthSession.findOne({
        where: { sessionToken, expires: { [Op.gt]: new Date() } },
        include: [{ model: models().User, as: 'user', required: true }],
      });
      if (!session?.user) return null;
      return { session: toAdapterSession(session), user: toAdapterUser(session.user) };
    },
    async updateSession({ sessionToken, expires }) {
      const [, rows] = await models().AuthSession.update(
        { ...(expires ? { expires } : {}) },
        { where: { sessionToken }, returning: true },
      );
      return rows[0] ? toAdapterSession(rows[0]) : null;
    },
    async deleteSession(sessionToken) {
      await models().AuthSession.destroy({ where: { sessionToken } });
    },
    async createVerificationToken(data) {
      await models().VerificationToken.create(data);
      return data;
    },
    async useVerificationToken({ identifier, token }): Promise<VerificationToken | null> {
      // One statement, so two clicks at once cannot both use the same link.
      const [, rows] = await models().VerificationToken.update(
        { usedAt: new Date() },
        { where: { identifier, token, usedAt: null }, returning: true },
      );
      const row = rows[0];
      return row ? { identifier: row.identifier, token: row.token, expires: row.expires } : null;
    },
  };
}
