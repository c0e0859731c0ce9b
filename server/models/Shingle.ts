import { DataTypes, Model, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/**
 * The shingle dictionary: each shingle's text and its rank in the global order (lower is rarer).
 * Not queried through Sequelize: the index reads and writes it in batch SQL (clone-index/dictionary.ts); the model types the table.
 */
export class Shingle extends Model<InferAttributes<Shingle>, InferCreationAttributes<Shingle>> {
  declare text: string;
  declare rank: number;
}

export function initShingle(sequelize: Sequelize) {
  Shingle.init(
    {
      text: { type: DataTypes.TEXT, primaryKey: true },
      rank: { type: DataTypes.INTEGER, allowNull: false, unique: true },
    },
    { sequelize, tableName: 'shingles', underscored: true, timestamps: false },
  );
}
