import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import { DEFAULT_REPOSITORY_SETTINGS as DEFAULTS } from '../../shared/constants';

/** A tracked codebase and its analysis settings (threshold, minimum tokens, shingle size, ignore list, clone budget). */
export class Repository extends Model<InferAttributes<Repository>, InferCreationAttributes<Repository>> {
  declare id: CreationOptional<number>;
  declare organisationId: string;
  declare name: string;
  declare description: CreationOptional<string>;
  declare threshold: CreationOptional<string>;
  declare minTokens: CreationOptional<number>;
  declare shingleSize: CreationOptional<number>;
  declare ignore: CreationOptional<string[]>;
  declare cloneBudget: CreationOptional<string | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export function initRepository(sequelize: Sequelize) {
  Repository.init(
    {
      id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
      organisationId: { type: DataTypes.UUID, allowNull: false },
      name: { type: DataTypes.TEXT, allowNull: false },
      description: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
      threshold: { type: DataTypes.DECIMAL(7, 6), allowNull: false, defaultValue: String(DEFAULTS.threshold) },
      minTokens: { type: DataTypes.INTEGER, allowNull: false, defaultValue: DEFAULTS.minTokens },
      shingleSize: { type: DataTypes.INTEGER, allowNull: false, defaultValue: DEFAULTS.shingleSize },
      ignore: { type: DataTypes.ARRAY(DataTypes.TEXT), allowNull: false, defaultValue: [] },
      cloneBudget: { type: DataTypes.DECIMAL(7, 6), allowNull: true, defaultValue: null },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: 'repositories', underscored: true, timestamps: true },
  );
}
