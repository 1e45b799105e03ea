import 'server-only';
import { Op } from 'sequelize';
import { AuditLog, User } from '@/db/models';
import { DEMO_ACCOUNTS, DEMO_PEOPLE } from '@/db/seeders/demo-scenario';
import { isDemoMode } from '@/lib/env';
import { authorizeUser, can, ROLES, type Actor, type Role } from '@/lib/policies';
import { UserListQuerySchema } from '@/lib/validation/accounts';

/** The signed-in person's own account, for /account and GET /api/account. */
export type AccountDTO = {
  id: string;
  email: string | null;
  name: string | null;
  role: Role;
  units: 'metric' | 'imperial';
  emailVerified: boolean;
  licenceAcceptedAt: string | null;
  joinedAt: string;
  isDemo: boolean;
  can: { acceptLicence: boolean; manageUsers: boolean; review: boolean };
};

/** The signed-in person's account. Throws UnauthenticatedError for visitors. */
export async function getAccount(actor: Actor): Promise<AccountDTO> {
  authorizeUser(actor, 'account.view');
  const user = await User.findByPk(actor.id, { rejectOnEmpty: true });
  return {
    id: user.id,
    email: user.email,
    name: user.name,
    role: user.role,
    units: user.units,
    emailVerified: !!user.emailVerified,
    licenceAcceptedAt: user.licenceAcceptedAt?.toISOString() ?? null,
    joinedAt: user.createdAt.toISOString(),
    isDemo: user.isDemo,
    can: {
      acceptLicence: can(actor, 'licence.accept'),
      manageUsers: can(actor, 'user.manage'),
      review: can(actor, 'review.view'),
    },
  };
}

/** One row of the admin user list. */
export type UserRowDTO = {
  id: string;
  email: string | null;
  name: string | null;
  role: Role;
  disabled: boolean;
  emailVerified: boolean;
  licenceAccepted: boolean;
  isDemo: boolean;
  joinedAt: string;
  isSelf: boolean;
};

export const USERS_PER_PAGE = 25;

/**
 * Users for the admin page, newest first, filtered by name or e-mail
 * (`{ q, page }`, validated here). Throws InvalidInputError for a bad filter; UnauthenticatedError/ForbiddenError unless the actor is an admin.
 */
export async function listUsers(actor: Actor, raw: unknown): Promise<{ users: UserRowDTO[]; total: number; page: number; pageCount: number; q: string }> {
  authorizeUser(actor, 'user.manage');
  const query = UserListQuerySchema.parse(raw);
  const like = `%${query.q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
  const where = query.q ? { [Op.or]: [{ email: { [Op.like]: like } }, { name: { [Op.like]: like } }] } : {};
  const { rows, count } = await User.findAndCountAll({
    where,
    order: [['createdAt', 'DESC'], ['id', 'ASC']],
    limit: USERS_PER_PAGE,
    offset: (query.page - 1) * USERS_PER_PAGE,
  });
  return {
    users: rows.map((u) => ({
      id: u.id,
      email: u.email,
      name: u.name,
      role: u.role,
      disabled: !!u.disabledAt,
      emailVerified: !!u.emailVerified,
      licenceAccepted: !!u.licenceAcceptedAt,
      isDemo: u.isDemo,
      joinedAt: u.createdAt.toISOString(),
      isSelf: u.id === actor.id,
    })),
    total: count,
    page: query.page,
    q: query.q,
    pageCount: Math.max(1, Math.ceil(count / USERS_PER_PAGE)),
  };
}

/** One audit entry about an account (role change, disabling, licence). */
export type AccessChangeDTO = { id: number; at: string; action: string; actorEmail: string | null; subjectEmail: string | null; details: Record<string, unknown> };

const ACCESS_ACTIONS = ['user.role-change', 'user.disable', 'user.enable', 'licence.accept'];

/** The newest account changes from the audit log. Admins only (throws otherwise). */
export async function listRecentAccessChanges(actor: Actor, limit = 15): Promise<AccessChangeDTO[]> {
  authorizeUser(actor, 'audit.view');
  const rows = await AuditLog.findAll({ where: { action: ACCESS_ACTIONS, subjectType: 'user' }, order: [['id', 'DESC']], limit });
  const ids = [...new Set(rows.flatMap((r) => [r.actorId, r.subjectId]).filter((v): v is string => !!v))];
  const users = ids.length ? await User.findAll({ where: { id: ids }, attributes: ['id', 'email'] }) : [];
  const email = new Map(users.map((u) => [u.id, u.email]));
  return rows.map((r) => ({
    id: Number(r.id),
    at: r.createdAt.toISOString(),
    action: r.action,
    actorEmail: r.actorId ? (email.get(r.actorId) ?? null) : null,
    subjectEmail: email.get(r.subjectId) ?? null,
    details: r.details,
  }));
}

/** A demo account offered on the sign-in page. */
export type DemoAccountDTO = { role: Role; name: string; available: boolean };

/** The demo account of each role, weakest first; empty unless demo mode is on. */
export async function listDemoAccounts(): Promise<DemoAccountDTO[]> {
  if (!isDemoMode()) return [];
  const people = ROLES.map((role) => ({ role, person: DEMO_PEOPLE.find((p) => p.key === DEMO_ACCOUNTS[role]) }));
  const emails = people.map((p) => p.person?.email).filter((e): e is string => !!e);
  const rows = await User.findAll({ where: { email: emails, isDemo: true }, attributes: ['email', 'disabledAt'] });
  const present = new Map(rows.map((r) => [r.email, !r.disabledAt]));
  return people
    .filter((p) => p.person)
    .map((p) => ({ role: p.role, name: p.person!.name, available: present.get(p.person!.email) ?? false }));
}
