import { DataTypes, type QueryInterface } from "sequelize";

/**
 * Hit counters of the rate limiters (server/middleware/rate-limit-store.ts), shared by every server
 * process: one row per limiter prefix and client key, with the end of its window.
 */
export async function up(qi: QueryInterface) {
  await qi.createTable("rate_limit_hits", {
    // `<prefix>:<client key>`; a key longer than the column (or not plain ASCII) is stored as its SHA-256.
    key: { type: DataTypes.STRING(191).BINARY, primaryKey: true },
    hits: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
    reset_at: { type: DataTypes.DATE(3), allowNull: false },
  });
  await qi.addIndex("rate_limit_hits", ["reset_at"], { name: "rate_limit_hits_reset_at" });
}

export async function down(qi: QueryInterface) {
  await qi.dropTable("rate_limit_hits");
}
