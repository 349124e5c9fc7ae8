import { DataTypes, type QueryInterface } from "sequelize";

export async function up(qi: QueryInterface) {
  await qi.createTable("sessions", {
    sid: { type: DataTypes.STRING(64), primaryKey: true },
    user_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
    expires: { type: DataTypes.DATE, allowNull: true },
    data: { type: DataTypes.TEXT, allowNull: true },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  });
  await qi.addIndex("sessions", ["user_id"], { name: "sessions_user_id" });
  await qi.addIndex("sessions", ["expires"], { name: "sessions_expires" });
}

export async function down(qi: QueryInterface) {
  await qi.dropTable("sessions");
}
