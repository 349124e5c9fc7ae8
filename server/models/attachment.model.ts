import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from "sequelize";
import { ATTACHMENT_KINDS, ATTACHMENT_STATUSES, type AttachmentKind, type AttachmentStatus } from "../../shared/schemas/attachment";

/**
 * A file attached to a job. The bytes live in Storage under `storageKey` (generated, never the user's
 * file name); `originalName` is the cleaned upload name, for display only.
 */
export class Attachment extends Model<InferAttributes<Attachment>, InferCreationAttributes<Attachment>> {
  declare id: CreationOptional<number>;
  declare companyId: number;
  declare jobId: number;
  declare kind: AttachmentKind;
  declare storageKey: string;
  declare thumbKey: string | null;
  declare originalName: string;
  declare mime: string;
  declare size: number;
  declare width: number | null;
  declare height: number | null;
  declare caption: CreationOptional<string>;
  declare showInProposal: CreationOptional<boolean>;
  declare forCrew: CreationOptional<boolean>;
  declare status: CreationOptional<AttachmentStatus>;
  declare errorMessage: string | null;
  declare uploadedBy: number | null;
  declare archivedAt: Date | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export const initAttachment = (sequelize: Sequelize) =>
  Attachment.init(
    {
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      companyId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      jobId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      kind: { type: DataTypes.ENUM(...ATTACHMENT_KINDS), allowNull: false },
      storageKey: { type: DataTypes.STRING(80), allowNull: false },
      thumbKey: { type: DataTypes.STRING(80), allowNull: true },
      originalName: { type: DataTypes.STRING(200), allowNull: false },
      mime: { type: DataTypes.STRING(100), allowNull: false },
      size: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      width: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      height: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      caption: { type: DataTypes.STRING(500), allowNull: false, defaultValue: "" },
      showInProposal: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
      forCrew: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
      status: { type: DataTypes.ENUM(...ATTACHMENT_STATUSES), allowNull: false, defaultValue: "ready" },
      errorMessage: { type: DataTypes.STRING(300), allowNull: true },
      uploadedBy: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      archivedAt: { type: DataTypes.DATE, allowNull: true },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: "attachments", underscored: true },
  );
