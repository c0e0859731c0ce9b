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

/**
 * A person who signs in. `passwordHash` is a bcrypt hash and never leaves the server (presenters
 * copy an explicit field list). A deactivated user keeps their row (authorship, assignments) but
 * cannot sign in.
 */
export class User extends Model<InferAttributes<User>, InferCreationAttributes<User>> {
  declare id: CreationOptional<string>;
  declare organisationId: string;
  declare email: string;
  declare name: string;
  declare role: Role;
  declare passwordHash: string;
  declare deactivatedAt: CreationOptional<Date | null>;
  declare lastSignedInAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  /** True unless the user has been deactivated. */
  get isActive(): NonAttribute<boolean> {
    return this.deactivatedAt === null || this.deactivatedAt === undefined;
  }
}

export function initUser(sequelize: Sequelize) {
  User.init(
    {
      id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
      organisationId: { type: DataTypes.UUID, allowNull: false },
      email: { type: DataTypes.STRING(254), allowNull: false, unique: true },
      name: { type: DataTypes.STRING(120), allowNull: false },
      role: { type: DataTypes.STRING(16), allowNull: false },
      passwordHash: { type: DataTypes.STRING(100), allowNull: false },
      deactivatedAt: { type: DataTypes.DATE, allowNull: true, defaultValue: null },
      lastSignedInAt: { type: DataTypes.DATE, allowNull: true, defaultValue: null },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: 'users', underscored: true },
  );
}
