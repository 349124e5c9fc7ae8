import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from "sequelize";

export class AuditEvent extends Model<InferAttributes<AuditEvent>, InferCreationAttributes<AuditEvent>> {
  declare id: CreationOptional<number>;
  declare companyId: number;
  declare actorId: number | null;
  declare entityType: string;
  declare entityId: string;
  /** The job the event concerns (job, roof, quote events), for the job's log; null otherwise. */
  declare jobId: CreationOptional<number | null>;
  declare action: string;
  declare changes: Record<string, unknown> | null;
  declare createdAt: CreationOptional<Date>;
}

export const initAuditEvent = (sequelize: Sequelize) =>
  AuditEvent.init(
    {
      id: { type: DataTypes.BIGINT.UNSIGNED, autoIncrement: true, primaryKey: true },
      companyId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      actorId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      entityType: { type: DataTypes.STRING(40), allowNull: false },
      entityId: { type: DataTypes.STRING(40), allowNull: false },
      jobId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      action: { type: DataTypes.STRING(60), allowNull: false },
      changes: { type: DataTypes.JSON, allowNull: true },
      createdAt: DataTypes.DATE,
    },
    { sequelize, tableName: "audit_events", underscored: true, updatedAt: false },
  );
