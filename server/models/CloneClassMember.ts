import { DataTypes, Model, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/**
 * A fragment of a snapshot file that belongs to a clone class, and whether it changed since the previous snapshot.
 * Not queried through Sequelize: written in one unnest batch per snapshot (queries/write-classes.ts); the model types the table.
 */
export class CloneClassMember extends Model<InferAttributes<CloneClassMember>, InferCreationAttributes<CloneClassMember>> {
  declare classId: number;
  declare snapshotFileId: number;
  declare fragmentId: number;
  declare codeChanged: boolean;
}

export function initCloneClassMember(sequelize: Sequelize) {
  CloneClassMember.init(
    {
      classId: { type: DataTypes.INTEGER, primaryKey: true },
      snapshotFileId: { type: DataTypes.INTEGER, primaryKey: true },
      fragmentId: { type: DataTypes.INTEGER, primaryKey: true },
      codeChanged: { type: DataTypes.BOOLEAN, allowNull: false },
    },
    { sequelize, tableName: 'clone_class_members', underscored: true, timestamps: false },
  );
}
