import { DataTypes, type QueryInterface } from "sequelize";

/** Deposit payments of accepted proposals; a row becomes paid only from a verified webhook. */
export async function up(qi: QueryInterface) {
  await qi.createTable("payments", {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    company_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, references: { model: "companies", key: "id" }, onDelete: "RESTRICT" },
    proposal_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, references: { model: "proposals", key: "id" }, onDelete: "RESTRICT" },
    job_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, references: { model: "jobs", key: "id" }, onDelete: "RESTRICT" },
    kind: { type: DataTypes.ENUM("deposit"), allowNull: false, defaultValue: "deposit" },
    amount_cents: { type: DataTypes.BIGINT, allowNull: false },
    currency: { type: DataTypes.CHAR(3), allowNull: false, defaultValue: "usd" },
    status: { type: DataTypes.ENUM("pending", "paid", "failed", "expired"), allowNull: false, defaultValue: "pending" },
    provider_session_id: { type: DataTypes.STRING(255), allowNull: true, unique: true },
    provider_payment_intent_id: { type: DataTypes.STRING(255), allowNull: true },
    paid_at: { type: DataTypes.DATE, allowNull: true },
    last_error: { type: DataTypes.STRING(1000), allowNull: true },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  });
  await qi.addIndex("payments", ["proposal_id", "status"], { name: "payments_proposal" });
  await qi.addIndex("payments", ["provider_payment_intent_id"], { name: "payments_intent" });
}

export async function down(qi: QueryInterface) {
  await qi.dropTable("payments");
}
