import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';

/**
 * One message the local mail catcher received, parsed. `toAddresses` are the envelope's
 * recipients (lower-cased), so a Bcc is listed too; `organisationId` decides which admins see it.
 */
export class OutboxMessage extends Model<InferAttributes<OutboxMessage>, InferCreationAttributes<OutboxMessage>> {
  declare id: CreationOptional<string>;
  declare organisationId: string | null;
  declare messageId: string | null;
  declare fromAddress: string;
  declare toAddresses: string[];
  declare subject: string;
  declare text: string;
  declare html: string | null;
  declare sizeBytes: number;
  declare receivedAt: Date;
}

/** Binds the model to a Sequelize instance (table `outbox_messages`). */
export function initOutboxMessage(sequelize: Sequelize) {
  OutboxMessage.init(
    {
      id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
      organisationId: { type: DataTypes.UUID, allowNull: true },
      messageId: { type: DataTypes.STRING(998), allowNull: true },
      fromAddress: { type: DataTypes.TEXT, allowNull: false },
      toAddresses: { type: DataTypes.ARRAY(DataTypes.TEXT), allowNull: false },
      subject: { type: DataTypes.TEXT, allowNull: false },
      text: { type: DataTypes.TEXT, allowNull: false },
      html: { type: DataTypes.TEXT, allowNull: true },
      sizeBytes: { type: DataTypes.INTEGER, allowNull: false },
      receivedAt: { type: DataTypes.DATE, allowNull: false },
    },
    { sequelize, tableName: 'outbox_messages', underscored: true, timestamps: false },
  );
}
