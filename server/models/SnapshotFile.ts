import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/**
 * A file of a snapshot: its path, its content, and its analysis, or why it was skipped or failed.
 * Not queried through Sequelize: loads write it in unnest batches (queries/files.ts); the model types the table and Snapshot's files association.
 */
export class SnapshotFile extends Model<InferAttributes<SnapshotFile>, InferCreationAttributes<SnapshotFile>> {
  declare id: CreationOptional<number>;
  declare snapshotId: number;
  declare path: string;
  declare contentHash: CreationOptional<string | null>;
  declare analysisId: CreationOptional<number | null>;
  declare language: CreationOptional<string | null>;
  declare skipReason: CreationOptional<string | null>;
  declare error: CreationOptional<string | null>;
}

export function initSnapshotFile(sequelize: Sequelize) {
  SnapshotFile.init(
    {
      id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
      snapshotId: { type: DataTypes.INTEGER, allowNull: false },
      path: { type: DataTypes.TEXT, allowNull: false },
      contentHash: { type: DataTypes.TEXT, allowNull: true },
      analysisId: { type: DataTypes.INTEGER, allowNull: true },
      language: { type: DataTypes.TEXT, allowNull: true },
      skipReason: { type: DataTypes.TEXT, allowNull: true },
      error: { type: DataTypes.TEXT, allowNull: true },
    },
    { sequelize, tableName: 'snapshot_files', underscored: true, timestamps: false },
  );
}
