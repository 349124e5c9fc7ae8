import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from "sequelize";

/** A one-time password reset; `tokenHash` is the hex SHA-256 of the token sent by e-mail. */
export class PasswordResetToken extends Model<
  InferAttributes<PasswordResetToken>,
  InferCreationAttributes<PasswordResetToken>
> {
  declare id: CreationOptional<number>;
  declare companyId: number;
  declare userId: number;
  declare tokenHash: string;
  declare expiresAt: Date;
  declare usedAt: CreationOptional<Date | null>;
  declare requestedIp: string | null;
  declare createdAt: CreationOptional<Date>;
}

export const initPasswordResetToken = (sequelize: Sequelize) =>
  PasswordResetToken.init(
    {
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      companyId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      userId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      tokenHash: { type: DataTypes.CHAR(64), allowNull: false, unique: true },
      expiresAt: { type: DataTypes.DATE, allowNull: false },
      usedAt: { type: DataTypes.DATE, allowNull: true },
      requestedIp: { type: DataTypes.STRING(45), allowNull: true },
      createdAt: DataTypes.DATE,
    },
    { sequelize, tableName: "password_reset_tokens", underscored: true, updatedAt: false },
  );
