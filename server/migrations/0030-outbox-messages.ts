import { DataTypes } from 'sequelize';
import type { Migration } from '../db/migrate';

/**
 * What the local mail catcher received: one row a message, newest first by `received_at`. The
 * organisation is the one the mail is about (server/mail/store.ts decides), so an organisation's
 * admins read only their own mail; a message with no organisation is shown to nobody. The
 * Message-ID is unique, so a retried delivery of one mail is stored once.
 */
export const up: Migration['up'] = async ({ queryInterface }) => {
  await queryInterface.createTable('outbox_messages', {
    id: { type: DataTypes.UUID, primaryKey: true, allowNull: false },
    organisation_id: {
      type: DataTypes.UUID,
      allowNull: true,
      references: { model: 'organisations', key: 'id' },
      onDelete: 'CASCADE',
    },
    message_id: { type: DataTypes.STRING(998), allowNull: true, unique: true },
    from_address: { type: DataTypes.TEXT, allowNull: false },
    to_addresses: { type: DataTypes.ARRAY(DataTypes.TEXT), allowNull: false },
    subject: { type: DataTypes.TEXT, allowNull: false },
    text: { type: DataTypes.TEXT, allowNull: false },
    html: { type: DataTypes.TEXT, allowNull: true },
    size_bytes: { type: DataTypes.INTEGER, allowNull: false },
    received_at: { type: DataTypes.DATE, allowNull: false },
  });
  await queryInterface.addIndex('outbox_messages', ['organisation_id', 'received_at']);
  await queryInterface.addIndex('outbox_messages', ['received_at']);
  await queryInterface.addIndex('outbox_messages', ['to_addresses'], { using: 'gin' });
};

export const down: Migration['down'] = async ({ queryInterface }) => {
  await queryInterface.dropTable('outbox_messages');
};
