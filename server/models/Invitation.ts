import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type NonAttribute,
  type Sequelize,
} from 'sequelize';
import type { Role } from '../../shared/roles';
import type { User } from './User';

/**
 * An invitation to join an organisation with a role. Only the SHA-256 of the one-time token is
 * stored; `acceptedAt` set means the link has been used and no longer works.
 */
export class Invitation extends Model<InferAttributes<Invitation>, InferCreationAttributes<Invitation>> {
  declare id: CreationOptional<string>;
  declare organisationId: string;
  declare invitedById: string | null;
  declare email: string;
  declare name: string;
  declare role: Role;
  declare tokenHash: string;
  declare expiresAt: Date;
  declare acceptedAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  /** Loaded with `include: [{ association: 'invitedBy' }]`. */
  declare invitedBy?: NonAttribute<User | null>;

  /** True while the link can still be used at `now`. */
  isUsable(now = new Date()): boolean {
    return !this.acceptedAt && this.expiresAt.getTime() > now.getTime();
  }
}

export function initInvitation(sequelize: Sequelize) {
  Invitation.init(
    {
      id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
      organisationId: { type: DataTypes.UUID, allowNull: false },
      invitedById: { type: DataTypes.UUID, allowNull: true },
      email: { type: DataTypes.STRING(254), allowNull: false },
      name: { type: DataTypes.STRING(120), allowNull: false },
      role: { type: DataTypes.STRING(16), allowNull: false },
      tokenHash: { type: DataTypes.STRING(64), allowNull: false, unique: true },
      expiresAt: { type: DataTypes.DATE, allowNull: false },
      acceptedAt: { type: DataTypes.DATE, allowNull: true, defaultValue: null },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: 'invitations', underscored: true },
  );
}
