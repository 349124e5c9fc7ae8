import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from "sequelize";
import type { RoofDocument } from "../../shared/schemas/roof";

/**
 * The measured roof of a job: one document (planes, stacks, defaultStackId, underlay) with an explicit
 * version for optimistic locking (starts at 1, +1 per accepted save), and the takeoff the engine
 * computed from it on the server.
 */
export class Roof extends Model<InferAttributes<Roof>, InferCreationAttributes<Roof>> {
  declare id: CreationOptional<number>;
  declare jobId: number;
  declare companyId: number;
  declare version: CreationOptional<number>;
  declare document: RoofDocument;
  declare takeoff: Record<string, unknown> | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export const initRoof = (sequelize: Sequelize) =>
  Roof.init(
    {
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      jobId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, unique: true },
      companyId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      version: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 1 },
      document: { type: DataTypes.JSON, allowNull: false },
      takeoff: { type: DataTypes.JSON, allowNull: true },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: "roofs", underscored: true },
  );
