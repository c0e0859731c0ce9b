import { DataTypes, Model, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/** The figures of one snapshot: tokens, clone ratio, pairs by type, classes, and what changed since the previous one. */
export class SnapshotMetric extends Model<InferAttributes<SnapshotMetric>, InferCreationAttributes<SnapshotMetric>> {
  declare snapshotId: number;
  declare fragmentTokens: number;
  declare clonedTokens: number;
  /** cloned tokens without the classes whose lineage was waived (after this load ended waivers) */
  declare unwaivedClonedTokens: number;
  declare cloneRatio: number;
  declare pairCount: number;
  declare classCount: number;
  declare type1Pairs: number;
  declare type2Pairs: number;
  declare type3Pairs: number;
  declare crossPairCount: number;
  declare newClassCount: number;
  declare driftedClassCount: number;
  declare goneClassCount: number;
}

export function initSnapshotMetric(sequelize: Sequelize) {
  SnapshotMetric.init(
    {
      snapshotId: { type: DataTypes.INTEGER, primaryKey: true },
      fragmentTokens: { type: DataTypes.BIGINT, allowNull: false },
      clonedTokens: { type: DataTypes.BIGINT, allowNull: false },
      unwaivedClonedTokens: { type: DataTypes.BIGINT, allowNull: false },
      cloneRatio: { type: DataTypes.DOUBLE, allowNull: false },
      pairCount: { type: DataTypes.INTEGER, allowNull: false },
      classCount: { type: DataTypes.INTEGER, allowNull: false },
      type1Pairs: { type: DataTypes.INTEGER, allowNull: false, field: 'type1_pairs' },
      type2Pairs: { type: DataTypes.INTEGER, allowNull: false, field: 'type2_pairs' },
      type3Pairs: { type: DataTypes.INTEGER, allowNull: false, field: 'type3_pairs' },
      crossPairCount: { type: DataTypes.INTEGER, allowNull: false },
      newClassCount: { type: DataTypes.INTEGER, allowNull: false },
      driftedClassCount: { type: DataTypes.INTEGER, allowNull: false },
      goneClassCount: { type: DataTypes.INTEGER, allowNull: false },
    },
    { sequelize, tableName: 'snapshot_metrics', underscored: true, timestamps: false },
  );
}
