import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/**
 * A shingle set, stored once per hash of its sorted shingles, as ascending ranks.
 * Not queried through Sequelize: the index reads and writes it in batch SQL (clone-index/sets.ts, probe.ts); the model types the table.
 */
export class ShingleSet extends Model<InferAttributes<ShingleSet>, InferCreationAttributes<ShingleSet>> {
  declare id: CreationOptional<number>;
  declare hash: string;
  declare size: number;
  declare ranks: number[];
}

export function initShingleSet(sequelize: Sequelize) {
  ShingleSet.init(
    {
      id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
      hash: { type: DataTypes.TEXT, allowNull: false, unique: true },
      size: { type: DataTypes.INTEGER, allowNull: false },
      ranks: { type: DataTypes.ARRAY(DataTypes.INTEGER), allowNull: false },
    },
    { sequelize, tableName: 'shingle_sets', underscored: true, timestamps: false },
  );
}
