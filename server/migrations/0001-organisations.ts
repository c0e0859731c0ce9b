import { DataTypes } from 'sequelize';
import type { Migration } from '../db/migrate';

/** The organisation a Doublet installation serves; every user belongs to one. */
export const up: Migration['up'] = async ({ queryInterface }) => {
  await queryInterface.createTable('organisations', {
    id: { type: DataTypes.UUID, primaryKey: true, allowNull: false },
    name: { type: DataTypes.STRING(120), allowNull: false },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  });
};

export const down: Migration['down'] = async ({ queryInterface }) => {
  await queryInterface.dropTable('organisations');
};
