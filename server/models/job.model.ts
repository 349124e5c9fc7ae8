import type { JobProposalProgress } from "../../shared/schemas/proposal-api";
import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type NonAttribute,
  type Sequelize,
} from "sequelize";
import { JOB_STATUSES, type JobSite, type JobStatus } from "../../shared/schemas/job";
import type { Customer } from "./customer.model";
import type { User } from "./user.model";

export class Job extends Model<InferAttributes<Job>, InferCreationAttributes<Job>> {
  declare id: CreationOptional<number>;
  declare companyId: number;
  declare customerId: number;
  declare siteAddressLine1: string | null;
  declare siteAddressLine2: string | null;
  declare siteCity: string | null;
  declare siteRegion: string | null;
  declare sitePostalCode: string | null;
  declare status: CreationOptional<JobStatus>;
  declare estimatorId: number | null;
  declare site: JobSite;
  declare notes: string | null;
  /** Squares of the stored takeoff (denormalised for the board); null until a roof is saved. */
  declare squares: CreationOptional<string | number | null>;
  /** Total of the job's current quote (denormalised for the board); filled by the quotes. */
  declare quoteTotalCents: CreationOptional<string | number | null>;
  declare archivedAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  declare customer?: NonAttribute<Customer>;
  declare estimator?: NonAttribute<User | null>;
  declare crew?: NonAttribute<User[]>;
  /** The latest proposal's progress, attached by JobsService.list / getDetail (not a column). */
  declare proposalProgress?: NonAttribute<JobProposalProgress | null>;
}

export const initJob = (sequelize: Sequelize) =>
  Job.init(
    {
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      companyId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      customerId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      siteAddressLine1: { type: DataTypes.STRING(160), allowNull: true },
      siteAddressLine2: { type: DataTypes.STRING(160), allowNull: true },
      siteCity: { type: DataTypes.STRING(80), allowNull: true },
      siteRegion: { type: DataTypes.STRING(80), allowNull: true },
      sitePostalCode: { type: DataTypes.STRING(20), allowNull: true },
      status: { type: DataTypes.ENUM(...JOB_STATUSES), allowNull: false, defaultValue: "lead" },
      estimatorId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      site: { type: DataTypes.JSON, allowNull: false },
      notes: { type: DataTypes.TEXT, allowNull: true },
      squares: { type: DataTypes.DECIMAL(10, 2), allowNull: true },
      quoteTotalCents: { type: DataTypes.BIGINT, allowNull: true },
      archivedAt: { type: DataTypes.DATE, allowNull: true },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: "jobs", underscored: true },
  );
