import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { GitImportStatus } from '../../shared/api/git-links';

/**
 * A repository's link to a git remote and the state of its last import. `remoteUrl` never holds
 * credentials (linking refuses a URL with them); `importError` has every URL's credentials redacted.
 */
export class GitLink extends Model<InferAttributes<GitLink>, InferCreationAttributes<GitLink>> {
  declare repositoryId: number;
  declare remoteUrl: string;
  declare tagPattern: string;
  declare createdBy: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare importStatus: CreationOptional<GitImportStatus | null>;
  declare importRequestedAt: CreationOptional<Date | null>;
  declare importStartedAt: CreationOptional<Date | null>;
  declare importFinishedAt: CreationOptional<Date | null>;
  declare importTagCount: CreationOptional<number | null>;
  declare importNewTagCount: CreationOptional<number | null>;
  declare importLoadedCount: CreationOptional<number | null>;
  declare importCurrentTag: CreationOptional<string | null>;
  declare importError: CreationOptional<string | null>;
}

/** Binds GitLink to the Sequelize instance. */
export function initGitLink(sequelize: Sequelize) {
  const nullable = <T>(type: T) => ({ type, allowNull: true, defaultValue: null });
  GitLink.init(
    {
      repositoryId: { type: DataTypes.INTEGER, primaryKey: true },
      remoteUrl: { type: DataTypes.TEXT, allowNull: false },
      tagPattern: { type: DataTypes.TEXT, allowNull: false, defaultValue: '*' },
      createdBy: { type: DataTypes.UUID, allowNull: true },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
      importStatus: nullable(DataTypes.TEXT),
      importRequestedAt: nullable(DataTypes.DATE),
      importStartedAt: nullable(DataTypes.DATE),
      importFinishedAt: nullable(DataTypes.DATE),
      importTagCount: nullable(DataTypes.INTEGER),
      importNewTagCount: nullable(DataTypes.INTEGER),
      importLoadedCount: nullable(DataTypes.INTEGER),
      importCurrentTag: nullable(DataTypes.TEXT),
      importError: nullable(DataTypes.TEXT),
    },
    { sequelize, tableName: 'git_links', underscored: true, timestamps: true },
  );
}
