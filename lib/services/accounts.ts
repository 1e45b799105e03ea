import 'server-only';
import { randomBytes } from 'node:crypto';
import { Op } from 'sequelize';
import { sequelize } from '@/db';
import { AuditLog, Session, User } from '@/db/models';
import { DEMO_ACCOUNTS, DEMO_PEOPLE } from '@/db/seeders/demo-scenario';
import { SESSION_MAX_AGE_SECONDS } from '@/lib/auth/cookies';
import { isDemoMode } from '@/lib/env';
import { ConflictError, ForbiddenError, InvalidInputError, NotFoundError } from '@/lib/errors';
import { authorize, authorizeUser, can, type Actor, type Role } from '@/lib/policies';
import {
  AccountSettingsSchema,
  DemoSignInSchema,
  LicenceAcceptSchema,
  UserAccessUpdateSchema,
  UserIdSchema,
} from '@/lib/validation/accounts';

/** The contribution licence a reader accepts to become a contributor (text and data). */
export const CONTRIBUTION_LICENCE = { name: 'CC BY-SA 4.0', url: 'https://creativecommons.org/licenses/by-sa/4.0/' } as const;

/** What a user-management write returns: the row as an admin sees it. */
export type UserAccessDTO = { id: string; email: string | null; role: Role; disabled: boolean };

const toAccessDTO = (u: User): UserAccessDTO => ({ id: u.id, email: u.email, role: u.role, disabled: !!u.disabledAt });

/**
 * Saves the signed-in person's settings (units). Throws UnauthenticatedError
 * for visitors and InvalidInputError (400, field messages) for bad input.
 */
export async function updateAccountSettings(actor: Actor, raw: unknown): Promise<{ units: 'metric' | 'imperial' }> {
  authorizeUser(actor, 'account.update');
  const input = AccountSettingsSchema.parse(raw);
  await User.update({ units: input.units }, { where: { id: actor.id } });
  return { units: input.units };
}

/**
 * A reader with a verified e-mail accepts the contribution licence and
 * becomes a contributor, in one transaction with an audit row. Throws
 * ForbiddenError when the e-mail is unverified or the person is past reader,
 * InvalidInputError when the box was not ticked.
 */
export async function acceptLicence(actor: Actor, raw: unknown): Promise<{ role: Role; licenceAcceptedAt: string }> {
  if (actor && actor.role === 'reader' && actor.emailVerified === false) {
    throw new ForbiddenError('Confirm your e-mail address first: sign in once with an e-mail link.');
  }
  if (actor && actor.role !== 'reader' && !actor.disabled) {
    throw new ForbiddenError('You have already accepted the contribution licence.');
  }
  authorizeUser(actor, 'licence.accept');
  LicenceAcceptSchema.parse(raw);
  return sequelize.transaction(async (transaction) => {
    const user = await User.findByPk(actor.id, { transaction, lock: transaction.LOCK.UPDATE });
    if (!user || user.disabledAt) throw new ForbiddenError('This account is disabled.');
    if (user.role !== 'reader') throw new ConflictError('You have already accepted the contribution licence.');
    const acceptedAt = new Date();
    await user.update({ role: 'contributor', licenceAcceptedAt: acceptedAt }, { transaction });
    await AuditLog.create(
      {
        actorId: actor.id,
        action: 'licence.accept',
        subjectType: 'user',
        subjectId: user.id,
        details: { licence: CONTRIBUTION_LICENCE.name, from: 'reader', to: 'contributor' },
      },
      { transaction },
    );
    return { role: 'contributor' as const, licenceAcceptedAt: acceptedAt.toISOString() };
  });
}

/**
 * An admin changes someone's role and/or disables or re-enables the account,
 * in one transaction that writes an audit row per change and ends a disabled
 * person's sessions. Throws UnauthenticatedError/ForbiddenError (not an admin,
 * or disabling oneself), InvalidInputError (bad id, unknown role, nothing
 * sent, contributor role without the licence), NotFoundError (no such user),
 * ConflictError (the change would leave no active admin).
 */
export async function updateUserAccess(actor: Actor, userId: unknown, raw: unknown): Promise<UserAccessDTO> {
  authorizeUser(actor, 'user.manage');
  const idResult = UserIdSchema.safeParse(userId);
  if (!idResult.success) throw new NotFoundError('No such user.');
  const id = idResult.data;
  const input = UserAccessUpdateSchema.parse(raw);
  if (input.role !== undefined) authorize(actor, 'user.change-role', { userId: id });
  if (input.disabled !== undefined && !can(actor, 'user.disable', { userId: id })) {
    throw new ForbiddenError('You cannot disable your own account; ask another admin.');
  }

  return sequelize
    .transaction(async (transaction) => {
      // Lock the target and every active admin in one statement, in id order, so
      // two admins demoting each other at the same moment queue up instead of
      // both succeeding (or deadlocking).
      const locked = await User.findAll({
        where: { [Op.or]: [{ id }, { role: 'admin', disabledAt: null }] },
        order: [['id', 'ASC']],
        transaction,
        lock: transaction.LOCK.UPDATE,
      });
      // The acting admin must still be one now that the rows are locked (another admin may just have changed that).
      if (!locked.some((u) => u.id === actor.id)) throw new ForbiddenError('Your own access has just changed; reload the page.');
      const user = locked.find((u) => u.id === id);
      if (!user) throw new NotFoundError('No such user.');
      const nextRole = input.role ?? user.role;
      const nextDisabled = input.disabled ?? !!user.disabledAt;
      const roleChanges = nextRole !== user.role;
      const disabledChanges = nextDisabled !== !!user.disabledAt;
      if (!roleChanges && !disabledChanges) return toAccessDTO(user);

      if (roleChanges && nextRole !== 'reader' && !user.licenceAcceptedAt) {
        throw new InvalidInputError(undefined, {
          role: ['This person has not accepted the contribution licence yet; they can do that on their account page.'],
        });
      }
      // Keep at least one active admin (every active admin row is locked above).
      const losesAdmin = user.role === 'admin' && !user.disabledAt && (nextRole !== 'admin' || nextDisabled);
      if (losesAdmin) {
        const others = locked.filter((u) => u.id !== user.id && u.role === 'admin' && !u.disabledAt);
        if (others.length === 0) {
          throw new ConflictError('Trialbed needs at least one active admin: make someone else an admin first.');
        }
      }

      const before = { role: user.role, disabled: !!user.disabledAt };
      await user.update({ role: nextRole, disabledAt: nextDisabled ? (user.disabledAt ?? new Date()) : null }, { transaction });
      if (roleChanges) {
        await AuditLog.create(
          { actorId: actor.id, action: 'user.role-change', subjectType: 'user', subjectId: user.id, details: { from: before.role, to: nextRole } },
          { transaction },
        );
      }
      if (disabledChanges) {
        await AuditLog.create(
          { actorId: actor.id, action: nextDisabled ? 'user.disable' : 'user.enable', subjectType: 'user', subjectId: user.id, details: { role: nextRole } },
          { transaction },
        );
        // A disabled person is signed out everywhere at once.
        if (nextDisabled) await Session.destroy({ where: { userId: user.id }, transaction });
      }
      return toAccessDTO(user);
    })
    .catch((err: unknown) => {
      if (isDeadlock(err)) throw new ConflictError('Someone changed this account at the same moment; reload and try again.');
      throw err;
    });
}

/** MariaDB's "deadlock found" (1213) or lock wait timeout (1205): the other writer won. */
function isDeadlock(err: unknown): boolean {
  const code = (err as { parent?: { errno?: number } })?.parent?.errno;
  return code === 1213 || code === 1205;
}

/** A session opened without mail (demo mode only): the token goes into the Auth.js session cookie. */
export type DemoSession = { sessionToken: string; expires: Date; userId: string };

/**
 * Opens a database session for the demo account of a role, as Auth.js would
 * after an e-mail link. Only in demo mode (TRIALBED_DEMO=1): otherwise, and
 * for a missing or disabled demo account, throws NotFoundError. Throws
 * InvalidInputError for an unknown role.
 */
export async function startDemoSession(raw: unknown): Promise<DemoSession> {
  if (!isDemoMode()) throw new NotFoundError('Demo sign-in is off on this site.');
  const { role } = DemoSignInSchema.parse(raw);
  const person = DEMO_PEOPLE.find((p) => p.key === DEMO_ACCOUNTS[role]);
  const user = person ? await User.findOne({ where: { email: person.email, isDemo: true } }) : null;
  if (!user || user.disabledAt) throw new NotFoundError('That demo account is not available.');
  const sessionToken = randomBytes(32).toString('base64url');
  const expires = new Date(Date.now() + SESSION_MAX_AGE_SECONDS * 1000);
  await Session.create({ sessionToken, userId: user.id, expires });
  return { sessionToken, expires, userId: user.id };
}
