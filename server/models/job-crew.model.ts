import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from "sequelize";

/** A crew member assigned to a job (crew read only the jobs they are assigned to). */
export class JobCrew extends Model<InferAttributes<JobCrew>, InferCreationAttributes<JobCrew>> {
  declare jobId: number;
  declare userId: number;
  declare createdAt: CreationOptional<Date>;
}

export const initJobCrew = (sequelize: Sequelize) =>
  JobCrew.init(
    {
      jobId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, primaryKey: true },
      userId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, primaryKey: true },
      createdAt: DataTypes.DATE,
    },
    { sequelize, tableName: "job_crew", underscored: true, updatedAt: false },
  );
