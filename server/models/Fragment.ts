import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/**
 * One function-level unit found by an analysis, with its identities and its shingle set.
 * Not queried through Sequelize: loads write it in unnest batches and reads join it with files and sets in SQL; the model types the table.
 */
export class Fragment extends Model<InferAttributes<Fragment>, InferCreationAttributes<Fragment>> {
  declare id: CreationOptional<number>;
  declare analysisId: number;
  declare ordinal: number;
  declare name: string;
  declare kind: string;
  declare startLine: number;
  declare startColumn: number;
  declare endLine: number;
  declare endColumn: number;
  declare tokens: number;
  declare tokenStart: number;
  declare tokenEnd: number;
  declare rawHash: string;
  declare normalizedHash: string;
  declare setId: number;
}

export function initFragment(sequelize: Sequelize) {
  Fragment.init(
    {
      id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
      analysisId: { type: DataTypes.INTEGER, allowNull: false },
      ordinal: { type: DataTypes.INTEGER, allowNull: false },
      name: { type: DataTypes.TEXT, allowNull: false },
      kind: { type: DataTypes.TEXT, allowNull: false },
      startLine: { type: DataTypes.INTEGER, allowNull: false },
      startColumn: { type: DataTypes.INTEGER, allowNull: false },
      endLine: { type: DataTypes.INTEGER, allowNull: false },
      endColumn: { type: DataTypes.INTEGER, allowNull: false },
      tokens: { type: DataTypes.INTEGER, allowNull: false },
      tokenStart: { type: DataTypes.INTEGER, allowNull: false },
      tokenEnd: { type: DataTypes.INTEGER, allowNull: false },
      rawHash: { type: DataTypes.TEXT, allowNull: false },
      normalizedHash: { type: DataTypes.TEXT, allowNull: false },
      setId: { type: DataTypes.INTEGER, allowNull: false },
    },
    { sequelize, tableName: 'fragments', underscored: true, timestamps: false },
  );
}
