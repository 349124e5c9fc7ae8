import { DataTypes, type QueryInterface } from "sequelize";

/** One-time password reset tokens; only the SHA-256 of the token is stored. */
export async function up(qi: QueryInterface) {
  await qi.createTable("password_reset_tokens", {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    company_id: {
      type: DataTypes.INTEGER.UNSIGNED,
      allowNull: false,
      references: { model: "companies", key: "id" },
      onDelete: "CASCADE",
    },
    user_id: {
      type: DataTypes.INTEGER.UNSIGNED,
      allowNull: false,
      references: { model: "users", key: "id" },
      onDelete: "CASCADE",
    },
    token_hash: { type: DataTypes.CHAR(64), allowNull: false, unique: true },
    expires_at: { type: DataTypes.DATE, allowNull: false },
    used_at: { type: DataTypes.DATE, allowNull: true },
    requested_ip: { type: DataTypes.STRING(45), allowNull: true },
    created_at: { type: DataTypes.DATE, allowNull: false },
  });
  await qi.addIndex("password_reset_tokens", ["user_id", "created_at"], { name: "password_reset_tokens_user" });
}

export async function down(qi: QueryInterface) {
  await qi.dropTable("password_reset_tokens");
}
