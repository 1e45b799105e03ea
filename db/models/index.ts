import 'server-only';
import { Account } from './Account';
import { AuditLog, AppMeta } from './AuditLog';
import { CheckIn } from './CheckIn';
import { EvidenceAggregate, EvidenceVerdict } from './EvidenceAggregate';
import { Feedstock } from './Feedstock';
import { FeedstockAlias } from './FeedstockAlias';
import { FeedstockRedirect } from './FeedstockRedirect';
import { FeedstockRequest } from './FeedstockRequest';
import { FeedstockRevision } from './FeedstockRevision';
import { OutboxMessage } from './OutboxMessage';
import { Photo } from './Photo';
import { Proposal, ProposalTrial, Vote } from './Proposal';
import { PublishedVerdict, VerdictHistory } from './PublishedVerdict';
import { RateLimit } from './RateLimit';
import { Session } from './Session';
import { Subscription } from './Subscription';
import { Trial } from './Trial';
import { User } from './User';
import { VerificationToken } from './VerificationToken';

// Associations, all in one place.
User.hasMany(Account, { foreignKey: 'userId' });
Account.belongsTo(User, { foreignKey: 'userId', onDelete: 'cascade' });
User.hasMany(Session, { foreignKey: 'userId' });
Session.belongsTo(User, { foreignKey: 'userId', onDelete: 'cascade' });

Feedstock.hasMany(FeedstockAlias, { foreignKey: 'feedstockId', as: 'aliases' });
FeedstockAlias.belongsTo(Feedstock, { foreignKey: 'feedstockId' });
Feedstock.hasMany(FeedstockRedirect, { foreignKey: 'feedstockId', as: 'redirects' });
Feedstock.hasMany(FeedstockRevision, { foreignKey: 'feedstockId', as: 'revisions' });
FeedstockRevision.belongsTo(Feedstock, { foreignKey: 'feedstockId' });
FeedstockRevision.belongsTo(User, { foreignKey: 'authorId', as: 'author' });
Feedstock.hasMany(PublishedVerdict, { foreignKey: 'feedstockId', as: 'publishedVerdicts' });
Feedstock.hasMany(EvidenceVerdict, { foreignKey: 'feedstockId', as: 'evidenceVerdicts' });
Feedstock.hasMany(EvidenceAggregate, { foreignKey: 'feedstockId', as: 'evidenceAggregates' });
Feedstock.hasMany(Trial, { foreignKey: 'feedstockId', as: 'trials' });

Trial.belongsTo(Feedstock, { foreignKey: 'feedstockId', as: 'feedstock' });
Trial.belongsTo(User, { foreignKey: 'ownerId', as: 'owner' });
Trial.hasMany(CheckIn, { foreignKey: 'trialId', as: 'checkIns' });
Trial.hasMany(Photo, { foreignKey: 'trialId', as: 'photos' });
Trial.belongsTo(Trial, { foreignKey: 'pairedTrialId', as: 'pairedTrial' });
CheckIn.belongsTo(Trial, { foreignKey: 'trialId' });
CheckIn.hasMany(Photo, { foreignKey: 'checkInId', as: 'photos' });

Proposal.belongsTo(Feedstock, { foreignKey: 'feedstockId', as: 'feedstock' });
Proposal.belongsTo(User, { foreignKey: 'authorId', as: 'author' });
Proposal.hasMany(Vote, { foreignKey: 'proposalId', as: 'votes' });
Proposal.belongsToMany(Trial, { through: ProposalTrial, foreignKey: 'proposalId', otherKey: 'trialId', as: 'trials' });
Vote.belongsTo(User, { foreignKey: 'voterId', as: 'voter' });
Vote.belongsTo(Proposal, { foreignKey: 'proposalId' });

export {
  Account,
  AppMeta,
  AuditLog,
  CheckIn,
  EvidenceAggregate,
  EvidenceVerdict,
  Feedstock,
  FeedstockAlias,
  FeedstockRedirect,
  FeedstockRequest,
  FeedstockRevision,
  OutboxMessage,
  Photo,
  Proposal,
  ProposalTrial,
  PublishedVerdict,
  RateLimit,
  Session,
  Subscription,
  Trial,
  User,
  VerdictHistory,
  VerificationToken,
  Vote,
};
