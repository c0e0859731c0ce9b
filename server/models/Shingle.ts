import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/**
 * The shingle dictionary: each shingle's text and its rank in the global order (lower is rarer).
 * Not queried through Sequelize: the index reads and writes it in batch SQL (clone-index/dictionary.ts); the model types the table.
 */
export class Shingle extends Model<InferAttributes<Shingle>, InferCreationAttributes<Shingle>> {
  declare id: CreationOptional<number>;
  declare text: string;
  declare rank: number;
}

export function initShingle(sequelize: Sequelize) {
  Shingle.init(
    {
      id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
      text: { type: DataTypes.TEXT, allowNull: false, unique: true },
      rank: { type: DataTypes.INTEGER, allowNull: false, unique: true },
    },
    { sequelize, tableName: 'shingles', underscored: true, timestamps: false },
  );
}
