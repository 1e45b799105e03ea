import { ForbiddenError, UnauthenticatedError } from '@/lib/errors';

/** Roles, weakest first. Each role can do everything the one before it can. */
export const ROLES = ['reader', 'contributor', 'editor', 'moderator', 'admin'] as const;
export type Role = (typeof ROLES)[number];

/** Who is acting: the signed-in user as the server knows them, or null for a visitor. */
export type Actor = {
  id: string;
  role: Role;
  email?: string | null;
  emailVerified?: boolean;
  disabled?: boolean;
  /** When the account was made; very new accounts cannot vote. */
  createdAt?: Date;
  /** The person's units preference, for showing doses. */
  units?: 'metric' | 'imperial';
} | null;

/**
 * What a rule may look at besides the actor: ownership and authorship, or
 * `userId`, the account an admin action is aimed at.
 */
export type Resource = { ownerId?: string | null; authorId?: string | null; userId?: string | null } | undefined;

/** Every action the app checks. One word per idea, as in PRODUCT.md. */
export const ACTIONS = [
  'feedstock.read',
  'feedstock.request',
  'feedstock.suggest-edit',
  'feedstock.edit',
  'feedstock.review-edit',
  'feedstock.create',
  'feedstock.rename',
  'feedstock.merge',
  'trial.read',
  'trial.create',
  'trial.update',
  'trial.close',
  'check-in.create',
  'photo.upload',
  'proposal.read',
  'proposal.create',
  'proposal.vote',
  'proposal.decide',
  'proposal.claim',
  'moderation.hide',
  'review.view',
  'subscription.create',
  'subscription.manage',
  'account.view',
  'account.update',
  'licence.accept',
  'user.manage',
  'user.change-role',
  'user.disable',
  'audit.view',
  'export.read',
] as const;
export type Action = (typeof ACTIONS)[number];

const rank = (role: Role) => ROLES.indexOf(role);
const atLeast = (actor: Actor, role: Role) => !!actor && !actor.disabled && rank(actor.role) >= rank(role);
const isOwner = (actor: Actor, r: Resource) => !!actor && !!r && (r.ownerId === actor.id || r.authorId === actor.id);

/** Accounts younger than this cannot vote (PRODUCT.md: very new accounts cannot vote). */
export const MIN_ACCOUNT_AGE_TO_VOTE_MS = 24 * 60 * 60 * 1000;

/** The rules, one predicate per action. */
const RULES: Record<Action, (actor: Actor, resource: Resource) => boolean> = {
  'feedstock.read': () => true,
  'trial.read': () => true,
  'proposal.read': () => true,
  'export.read': () => true,
  'feedstock.request': () => true,
  'feedstock.suggest-edit': (a) => atLeast(a, 'contributor'),
  'feedstock.edit': (a) => atLeast(a, 'editor'),
  'feedstock.review-edit': (a) => atLeast(a, 'editor'),
  'feedstock.create': (a) => atLeast(a, 'editor'),
  'feedstock.rename': (a) => atLeast(a, 'editor'),
  'feedstock.merge': (a) => atLeast(a, 'editor'),
  'trial.create': (a) => atLeast(a, 'contributor'),
  // Owners update and close their own trials; moderators may correct any.
  'trial.update': (a, r) => (atLeast(a, 'contributor') && isOwner(a, r)) || atLeast(a, 'moderator'),
  'trial.close': (a, r) => (atLeast(a, 'contributor') && isOwner(a, r)) || atLeast(a, 'moderator'),
  'check-in.create': (a, r) => atLeast(a, 'contributor') && (isOwner(a, r) || atLeast(a, 'moderator')),
  'photo.upload': (a, r) => atLeast(a, 'contributor') && (isOwner(a, r) || atLeast(a, 'moderator')),
  'proposal.create': (a) => atLeast(a, 'contributor'),
  // No vote on one's own proposal; very new accounts wait a day.
  'proposal.vote': (a, r) =>
    atLeast(a, 'contributor') &&
    !isOwner(a, r) &&
    !isTooNewToVote(a),
  'proposal.decide': (a) => atLeast(a, 'moderator'),
  'proposal.claim': (a) => atLeast(a, 'editor'),
  'moderation.hide': (a) => atLeast(a, 'moderator'),
  'review.view': (a) => atLeast(a, 'editor'),
  // Anyone may ask to follow: visitors by e-mail with double opt-in, readers in one click.
  'subscription.create': () => true,
  // One's own subscriptions only (made with the account, or with its confirmed address); no resource: the list of one's own.
  'subscription.manage': (a, r) => atLeast(a, 'reader') && (r === undefined || isOwner(a, r)),
  'account.view': (a) => atLeast(a, 'reader'),
  'account.update': (a) => atLeast(a, 'reader'),
  // A reader becomes a contributor by accepting the licence once the e-mail is verified.
  'licence.accept': (a) => !!a && !a.disabled && a.role === 'reader' && a.emailVerified !== false,
  // Admins list users and change roles. Whether a change would leave no admin
  // depends on the other rows, so lib/services/accounts.ts checks that in its transaction.
  'user.manage': (a) => atLeast(a, 'admin'),
  'user.change-role': (a) => atLeast(a, 'admin'),
  // Nobody disables their own account (that would sign them out for good); another admin can.
  'user.disable': (a, r) => atLeast(a, 'admin') && !!r?.userId && r.userId !== a!.id,
  'audit.view': (a) => atLeast(a, 'admin'),
};

/** True when the actor may perform the action (on the resource, where ownership matters). */
export function can(actor: Actor, action: Action, resource?: Resource): boolean {
  return RULES[action](actor, resource);
}

/**
 * Throws unless the actor may perform the action: UnauthenticatedError (401)
 * for a visitor when signing in could help, ForbiddenError (403) otherwise.
 */
export function authorize(actor: Actor, action: Action, resource?: Resource): void {
  if (can(actor, action, resource)) return;
  if (!actor) throw new UnauthenticatedError();
  if (actor.disabled) throw new ForbiddenError('This account is disabled.');
  throw new ForbiddenError();
}

/** Like `authorize`, for actions that need a signed-in user; narrows the actor to non-null. */
export function authorizeUser(actor: Actor, action: Action, resource?: Resource): asserts actor is NonNullable<Actor> {
  if (!actor) throw new UnauthenticatedError();
  authorize(actor, action, resource);
}

/** True when the account is too young to vote yet (the waiting time is MIN_ACCOUNT_AGE_TO_VOTE_MS). */
export function isTooNewToVote(actor: Actor, now: number = Date.now()): boolean {
  return !!actor?.createdAt && now - actor.createdAt.getTime() < MIN_ACCOUNT_AGE_TO_VOTE_MS;
}
