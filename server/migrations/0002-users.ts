import { DataTypes } from 'sequelize';
import type { Migration } from '../db/migrate';

/** People who sign in. E-mail is unique across the installation because sign-in is by e-mail. */
export const up: Migration['up'] = async ({ queryInterface, sequelize }) => {
  await queryInterface.createTable('users', {
    id: { type: DataTypes.UUID, primaryKey: true, allowNull: false },
    organisation_id: {
      type: DataTypes.UUID,
      allowNull: false,
      references: { model: 'organisations', key: 'id' },
      onDelete: 'CASCADE',
    },
    email: { type: DataTypes.STRING(254), allowNull: false, unique: true },
    name: { type: DataTypes.STRING(120), allowNull: false },
    role: { type: DataTypes.STRING(16), allowNull: false },
    password_hash: { type: DataTypes.STRING(100), allowNull: false },
    deactivated_at: { type: DataTypes.DATE, allowNull: true },
    last_signed_in_at: { type: DataTypes.DATE, allowNull: true },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  });
  await sequelize.query(
    `alter table users add constraint users_role_check check (role in ('admin', 'lead', 'engineer', 'viewer'))`,
  );
  await queryInterface.addIndex('users', ['organisation_id']);
};

export const down: Migration['down'] = async ({ queryInterface }) => {
  await queryInterface.dropTable('users');
};
