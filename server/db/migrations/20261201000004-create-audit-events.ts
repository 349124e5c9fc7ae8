import { DataTypes, type QueryInterface } from "sequelize";

export async function up(qi: QueryInterface) {
  await qi.createTable("audit_events", {
    id: { type: DataTypes.BIGINT.UNSIGNED, autoIncrement: true, primaryKey: true },
    company_id: {
      type: DataTypes.INTEGER.UNSIGNED,
      allowNull: false,
      references: { model: "companies", key: "id" },
      onDelete: "CASCADE",
    },
    actor_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
    entity_type: { type: DataTypes.STRING(40), allowNull: false },
    entity_id: { type: DataTypes.STRING(40), allowNull: false },
    action: { type: DataTypes.STRING(60), allowNull: false },
    changes: { type: DataTypes.JSON, allowNull: true },
    created_at: { type: DataTypes.DATE, allowNull: false },
  });
  await qi.addIndex("audit_events", ["company_id", "entity_type", "entity_id", "created_at"], {
    name: "audit_events_entity",
  });
  await qi.addIndex("audit_events", ["company_id", "created_at"], { name: "audit_events_company_time" });
}

export async function down(qi: QueryInterface) {
  await qi.dropTable("audit_events");
}
