import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/**
 * A repository-scoped API token. The secret itself is never stored: `tokenHash` is its SHA-256
 * (hex) and `prefix` its first characters, for display. Revoked or expired tokens keep their row
 * so the list still shows them.
 */
export class ApiToken extends Model<InferAttributes<ApiToken>, InferCreationAttributes<ApiToken>> {
  declare id: CreationOptional<number>;
  declare organisationId: string;
  declare repositoryId: number;
  declare name: string;
  declare tokenHash: string;
  declare prefix: string;
  declare createdBy: string | null;
  declare createdAt: CreationOptional<Date>;
  declare expiresAt: CreationOptional<Date | null>;
  declare lastUsedAt: CreationOptional<Date | null>;
  declare revokedAt: CreationOptional<Date | null>;
}

/** Binds ApiToken to the Sequelize instance. */
export function initApiToken(sequelize: Sequelize) {
  ApiToken.init(
    {
      id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
      organisationId: { type: DataTypes.UUID, allowNull: false },
      repositoryId: { type: DataTypes.INTEGER, allowNull: false },
      name: { type: DataTypes.TEXT, allowNull: false },
      tokenHash: { type: DataTypes.CHAR(64), allowNull: false },
      prefix: { type: DataTypes.TEXT, allowNull: false },
      createdBy: { type: DataTypes.UUID, allowNull: true },
      createdAt: DataTypes.DATE,
      expiresAt: { type: DataTypes.DATE, allowNull: true, defaultValue: null },
      lastUsedAt: { type: DataTypes.DATE, allowNull: true, defaultValue: null },
      revokedAt: { type: DataTypes.DATE, allowNull: true, defaultValue: null },
    },
    { sequelize, tableName: 'api_tokens', underscored: true, timestamps: true, updatedAt: false },
  );
}
