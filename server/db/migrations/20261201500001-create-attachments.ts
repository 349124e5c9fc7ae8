import { DataTypes, type QueryInterface } from "sequelize";

export async function up(qi: QueryInterface) {
  await qi.createTable("attachments", {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    company_id: {
      type: DataTypes.INTEGER.UNSIGNED,
      allowNull: false,
      references: { model: "companies", key: "id" },
      onDelete: "RESTRICT",
    },
    job_id: {
      type: DataTypes.INTEGER.UNSIGNED,
      allowNull: false,
      references: { model: "jobs", key: "id" },
      onDelete: "CASCADE",
    },
    kind: { type: DataTypes.ENUM("photo", "plan", "document", "csv"), allowNull: false },
    storage_key: { type: DataTypes.STRING(80), allowNull: false, unique: true },
    thumb_key: { type: DataTypes.STRING(80), allowNull: true },
    original_name: { type: DataTypes.STRING(200), allowNull: false },
    mime: { type: DataTypes.STRING(100), allowNull: false },
    size: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    width: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
    height: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
    caption: { type: DataTypes.STRING(500), allowNull: false, defaultValue: "" },
    show_in_proposal: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    for_crew: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    status: { type: DataTypes.ENUM("ready", "processing", "failed"), allowNull: false, defaultValue: "ready" },
    error_message: { type: DataTypes.STRING(300), allowNull: true },
    uploaded_by: {
      type: DataTypes.INTEGER.UNSIGNED,
      allowNull: true,
      references: { model: "users", key: "id" },
      onDelete: "SET NULL",
    },
    archived_at: { type: DataTypes.DATE, allowNull: true },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  });
  await qi.addIndex("attachments", ["company_id", "job_id", "archived_at"], { name: "attachments_job" });
}

export async function down(qi: QueryInterface) {
  await qi.dropTable("attachments");
}
