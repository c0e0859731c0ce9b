import { DataTypes, Model, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/**
 * One rank of a stored set's probing prefix: what a probe looks up (rank, then size range).
 * Not queried through Sequelize: the index writes and probes it in batch SQL (clone-index/sets.ts, probe.ts); the model types the table.
 */
export class PrefixEntry extends Model<InferAttributes<PrefixEntry>, InferCreationAttributes<PrefixEntry>> {
  declare rank: number;
  declare setId: number;
  declare position: number;
  declare size: number;
}

export function initPrefixEntry(sequelize: Sequelize) {
  PrefixEntry.init(
    {
      rank: { type: DataTypes.INTEGER, allowNull: false },
      setId: { type: DataTypes.INTEGER, allowNull: false },
      position: { type: DataTypes.INTEGER, allowNull: false },
      size: { type: DataTypes.INTEGER, allowNull: false },
    },
    { sequelize, tableName: 'prefix_entries', underscored: true, timestamps: false },
  );
  PrefixEntry.removeAttribute('id');
}
