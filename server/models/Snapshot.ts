import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { LoadProgressDTO, SnapshotStatus } from '../../shared/api/snapshots';

/** The repository's settings a snapshot was loaded with, kept with it (later changes do not rewrite it). */
export interface SnapshotSettings {
  threshold: number;
  minTokens: number;
  shingleSize: number;
  ignore: string[];
}

/** One analysed state of a repository with its release label, counts, timings and clone ratio. */
export class Snapshot extends Model<InferAttributes<Snapshot>, InferCreationAttributes<Snapshot>> {
  declare id: CreationOptional<number>;
  declare repositoryId: number;
  declare label: string;
  declare source: CreationOptional<string>;
  declare commitSha: CreationOptional<string | null>;
  declare status: CreationOptional<SnapshotStatus>;
  declare error: CreationOptional<string | null>;
  declare progress: CreationOptional<LoadProgressDTO | null>;
  declare startedBy: CreationOptional<string | null>;
  declare archiveSha256: CreationOptional<string | null>;
  declare loadAttempt: CreationOptional<number>;
  declare settings: CreationOptional<SnapshotSettings>;
  declare fileCount: CreationOptional<number>;
  declare skippedCount: CreationOptional<number>;
  declare failedCount: CreationOptional<number>;
  declare analyzedFileCount: CreationOptional<number>;
  declare fragmentCount: CreationOptional<number>;
  declare newSetCount: CreationOptional<number>;
  declare cloneRatio: CreationOptional<number | null>;
  declare timings: CreationOptional<Record<string, number>>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export function initSnapshot(sequelize: Sequelize) {
  Snapshot.init(
    {
      id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
      repositoryId: { type: DataTypes.INTEGER, allowNull: false },
      label: { type: DataTypes.TEXT, allowNull: false },
      source: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'folder' },
      commitSha: { type: DataTypes.TEXT, allowNull: true },
      status: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'queued' },
      error: { type: DataTypes.TEXT, allowNull: true },
      progress: { type: DataTypes.JSONB, allowNull: true },
      startedBy: { type: DataTypes.UUID, allowNull: true },
      archiveSha256: { type: DataTypes.CHAR(64), allowNull: true, field: 'archive_sha256' },
      loadAttempt: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
      settings: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
      fileCount: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
      skippedCount: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
      failedCount: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
      analyzedFileCount: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
      fragmentCount: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
      newSetCount: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
      cloneRatio: { type: DataTypes.DOUBLE, allowNull: true },
      timings: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: 'snapshots', underscored: true, timestamps: true },
  );
}
