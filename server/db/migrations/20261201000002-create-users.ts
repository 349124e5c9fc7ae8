import { DataTypes, type QueryInterface } from "sequelize";

export async function up(qi: QueryInterface) {
  await qi.createTable("users", {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    company_id: {
      type: DataTypes.INTEGER.UNSIGNED,
      allowNull: false,
      references: { model: "companies", key: "id" },
      onDelete: "RESTRICT",
    },
    email: { type: DataTypes.STRING(254), allowNull: false, unique: true },
    name: { type: DataTypes.STRING(120), allowNull: false },
    role: { type: DataTypes.ENUM("owner", "estimator", "crew"), allowNull: false },
    password_hash: { type: DataTypes.STRING(100), allowNull: false },
    active: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
    last_login_at: { type: DataTypes.DATE, allowNull: true },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  });
  await qi.addIndex("users", ["company_id", "role", "active"], { name: "users_company_role_active" });
}

export async function down(qi: QueryInterface) {
  await qi.dropTable("users");
}
