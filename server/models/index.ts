import type { Sequelize } from 'sequelize';
import { Invitation, initInvitation } from './Invitation';
import { Organisation, initOrganisation } from './Organisation';
import { User, initUser } from './User';
import { Repository, initRepository } from './Repository';
import { Snapshot, initSnapshot } from './Snapshot';
import { FileContent, initFileContent } from './FileContent';
import { Analysis, initAnalysis } from './Analysis';
import { Fragment, initFragment } from './Fragment';
import { SnapshotFile, initSnapshotFile } from './SnapshotFile';
import { Shingle, initShingle } from './Shingle';
import { ShingleSet, initShingleSet } from './ShingleSet';
import { PrefixEntry, initPrefixEntry } from './PrefixEntry';
import { SetPair, initSetPair } from './SetPair';
import { CloneClass, initCloneClass } from './CloneClass';
import { CloneClassMember, initCloneClassMember } from './CloneClassMember';
import { SnapshotMetric, initSnapshotMetric } from './SnapshotMetric';
import { OutboxMessage, initOutboxMessage } from './OutboxMessage';
import { ApiToken, initApiToken } from './ApiToken';
import { GitLink, initGitLink } from './GitLink';

export {
  Invitation,
  Organisation,
  User,
  Repository,
  Snapshot,
  FileContent,
  Analysis,
  Fragment,
  SnapshotFile,
  Shingle,
  ShingleSet,
  PrefixEntry,
  SetPair,
  CloneClass,
  CloneClassMember,
  SnapshotMetric,
  OutboxMessage,
  ApiToken,
  GitLink,
};

const initialised = new WeakSet<Sequelize>();

/**
 * Binds every model to the Sequelize instance and declares the associations. Idempotent per
 * instance, so createApp(), commands and tests may all call it. Add new models here (init first,
 * then associations).
 */
export function initModels(sequelize: Sequelize): void {
  if (initialised.has(sequelize)) return;
  initialised.add(sequelize);

  initOrganisation(sequelize);
  initUser(sequelize);
  initInvitation(sequelize);
  initRepository(sequelize);
  initSnapshot(sequelize);
  initFileContent(sequelize);
  initAnalysis(sequelize);
  initFragment(sequelize);
  initSnapshotFile(sequelize);
  initShingle(sequelize);
  initShingleSet(sequelize);
  initPrefixEntry(sequelize);
  initSetPair(sequelize);
  initCloneClass(sequelize);
  initCloneClassMember(sequelize);
  initSnapshotMetric(sequelize);
  initOutboxMessage(sequelize);
  initApiToken(sequelize);
  initGitLink(sequelize);

  Organisation.hasMany(User, { foreignKey: 'organisationId', as: 'users' });
  User.belongsTo(Organisation, { foreignKey: 'organisationId', as: 'organisation' });
  Invitation.belongsTo(User, { foreignKey: 'invitedById', as: 'invitedBy' });

  Organisation.hasMany(Repository, { foreignKey: 'organisationId', as: 'repositories' });
  Repository.hasMany(Snapshot, { foreignKey: 'repositoryId', as: 'snapshots' });
  Snapshot.belongsTo(Repository, { foreignKey: 'repositoryId', as: 'repository' });
  Snapshot.hasMany(SnapshotFile, { foreignKey: 'snapshotId', as: 'files' });
  Snapshot.hasOne(SnapshotMetric, { foreignKey: 'snapshotId', as: 'metrics' });
  Snapshot.hasMany(CloneClass, { foreignKey: 'snapshotId', as: 'cloneClasses' });
  CloneClass.belongsTo(Snapshot, { foreignKey: 'snapshotId', as: 'snapshot' });
  CloneClass.hasMany(CloneClassMember, { foreignKey: 'classId', as: 'members' });
  Analysis.hasMany(Fragment, { foreignKey: 'analysisId', as: 'fragments' });
}
