import { DataTypes } from 'sequelize';
import type { Migration } from '../db/migrate';

/**
 * Invitations by e-mail. Only a SHA-256 of the one-time token is stored, so a database read does
 * not hand out working links.
 */
export const up: Migration['up'] = async ({ queryInterface, sequelize }) => {
  await queryInterface.createTable('invitations', {
    id: { type: DataTypes.UUID, primaryKey: true, allowNull: false },
    organisation_id: {
      type: DataTypes.UUID,
      allowNull: false,
      references: { model: 'organisations', key: 'id' },
      onDelete: 'CASCADE',
    },
    invited_by_id: {
      type: DataTypes.UUID,
      allowNull: true,
      references: { model: 'users', key: 'id' },
      onDelete: 'SET NULL',
    },
    email: { type: DataTypes.STRING(254), allowNull: false },
    name: { type: DataTypes.STRING(120), allowNull: false },
    role: { type: DataTypes.STRING(16), allowNull: false },
    token_hash: { type: DataTypes.STRING(64), allowNull: false, unique: true },
    expires_at: { type: DataTypes.DATE, allowNull: false },
    accepted_at: { type: DataTypes.DATE, allowNull: true },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  });
  await sequelize.query(
    `alter table invitations add constraint invitations_role_check check (role in ('admin', 'lead', 'engineer', 'viewer'))`,
  );
  await queryInterface.addIndex('invitations', ['organisation_id']);
};

export const down: Migration['down'] = async ({ queryInterface }) => {
  await queryInterface.dropTable('invitations');
};
