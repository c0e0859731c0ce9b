import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/**
 * One analysis of one file content under one set of analyzer options (its fragments hang off it).
 * Not queried through Sequelize: loads write and read it in batches (queries/files.ts); the model types the table and its fragments association.
 */
export class Analysis extends Model<InferAttributes<Analysis>, InferCreationAttributes<Analysis>> {
  declare id: CreationOptional<number>;
  declare contentHash: string;
  declare optionsKey: string;
  declare language: string;
  declare error: CreationOptional<string | null>;
}

export function initAnalysis(sequelize: Sequelize) {
  Analysis.init(
    {
      id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
      contentHash: { type: DataTypes.TEXT, allowNull: false },
      optionsKey: { type: DataTypes.TEXT, allowNull: false },
      language: { type: DataTypes.TEXT, allowNull: false },
      error: { type: DataTypes.TEXT, allowNull: true },
    },
    { sequelize, tableName: 'analyses', underscored: true, timestamps: false },
  );
}
