import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/** The shingle dictionary: each shingle's text and its rank in the global order (lower is rarer). */
export class Shingle extends Model<InferAttributes<Shingle>, InferCreationAttributes<Shingle>> {
  declare id: CreationOptional<number>;
  declare text: string;
  declare rank: number;
}

/** Binds the model to a Sequelize instance (table `shingles`). */
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
