import { DataTypes, Model, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/**
 * The text of a file, stored once per sha-256 of its bytes, whichever snapshots hold it.
 * Not queried through Sequelize: loads write it in unnest batches (queries/files.ts); the model keeps the table's columns typed beside the others.
 */
export class FileContent extends Model<InferAttributes<FileContent>, InferCreationAttributes<FileContent>> {
  declare hash: string;
  declare text: string;
  declare byteSize: number;
}

export function initFileContent(sequelize: Sequelize) {
  FileContent.init(
    {
      hash: { type: DataTypes.TEXT, primaryKey: true },
      text: { type: DataTypes.TEXT, allowNull: false },
      byteSize: { type: DataTypes.INTEGER, allowNull: false },
    },
    { sequelize, tableName: 'file_contents', underscored: true, timestamps: false },
  );
}
