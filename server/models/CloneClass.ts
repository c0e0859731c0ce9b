import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/**
 * A clone class of one snapshot, with its size, similarity range, type and status against the previous snapshot.
 * Not queried through Sequelize: lists filter, sort and page it in SQL (queries/classes.ts); the model types the table and its associations.
 */
export class CloneClass extends Model<InferAttributes<CloneClass>, InferCreationAttributes<CloneClass>> {
  declare id: CreationOptional<number>;
  declare snapshotId: number;
  declare ordinal: number;
  declare size: number;
  declare tokens: number;
  declare minSimilarity: number;
  declare maxSimilarity: number;
  declare cloneType: number;
  declare language: string;
  declare status: string;
  declare previousClassId: CreationOptional<number | null>;
}

export function initCloneClass(sequelize: Sequelize) {
  CloneClass.init(
    {
      id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
      snapshotId: { type: DataTypes.INTEGER, allowNull: false },
      ordinal: { type: DataTypes.INTEGER, allowNull: false },
      size: { type: DataTypes.INTEGER, allowNull: false },
      tokens: { type: DataTypes.INTEGER, allowNull: false },
      minSimilarity: { type: DataTypes.DOUBLE, allowNull: false },
      maxSimilarity: { type: DataTypes.DOUBLE, allowNull: false },
      cloneType: { type: DataTypes.INTEGER, allowNull: false },
      language: { type: DataTypes.TEXT, allowNull: false },
      status: { type: DataTypes.TEXT, allowNull: false },
      previousClassId: { type: DataTypes.INTEGER, allowNull: true },
    },
    { sequelize, tableName: 'clone_classes', underscored: true, timestamps: false },
  );
}
