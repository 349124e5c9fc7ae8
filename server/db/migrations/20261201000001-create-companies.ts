import { DataTypes, type QueryInterface } from "sequelize";

export async function up(qi: QueryInterface) {
  await qi.createTable("companies", {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    name: { type: DataTypes.STRING(160), allowNull: false },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  });
}

export async function down(qi: QueryInterface) {
  await qi.dropTable("companies");
}
