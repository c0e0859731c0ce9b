import { DataTypes, Model, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/**
 * Two stored sets whose similarity reaches the index threshold, with their exact overlap (setA < setB).
 * Not queried through Sequelize: the index writes it and snapshot-pairs.ts reads it in batch SQL; the model types the table.
 */
export class SetPair extends Model<InferAttributes<SetPair>, InferCreationAttributes<SetPair>> {
  declare setA: number;
  declare setB: number;
  declare overlap: number;
  declare similarity: number;
}

export function initSetPair(sequelize: Sequelize) {
  SetPair.init(
    {
      setA: { type: DataTypes.INTEGER, primaryKey: true },
      setB: { type: DataTypes.INTEGER, primaryKey: true },
      overlap: { type: DataTypes.INTEGER, allowNull: false },
      similarity: { type: DataTypes.DOUBLE, allowNull: false },
    },
    { sequelize, tableName: 'set_pairs', underscored: true, timestamps: false },
  );
}
