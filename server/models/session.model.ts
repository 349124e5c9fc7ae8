import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";

/** express-session rows (connect-session-sequelize), with the signed-in user so sessions can be ended per user. */
export class Session extends Model<InferAttributes<Session>, InferCreationAttributes<Session>> {
  declare sid: string;
  declare userId: number | null;
  declare expires: Date | null;
  declare data: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export const sessionAttributes = {
  sid: { type: DataTypes.STRING(64), primaryKey: true },
  userId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
  expires: { type: DataTypes.DATE, allowNull: true },
  data: { type: DataTypes.TEXT, allowNull: true },
  createdAt: DataTypes.DATE,
  updatedAt: DataTypes.DATE,
};

export const initSession = (sequelize: Sequelize) =>
  Session.init(sessionAttributes, { sequelize, tableName: "sessions", underscored: true, modelName: "Session" });
