import { DataTypes, type QueryInterface } from "sequelize";

/** Every verified provider event, once by its id: a replayed event finds its row and changes nothing. */
export async function up(qi: QueryInterface) {
  await qi.createTable("payment_events", {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    event_id: { type: DataTypes.STRING(255), allowNull: false, unique: true },
    type: { type: DataTypes.STRING(100), allowNull: false },
    payment_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true, references: { model: "payments", key: "id" }, onDelete: "SET NULL" },
    received_at: { type: DataTypes.DATE, allowNull: false },
    processed_at: { type: DataTypes.DATE, allowNull: true },
  });
}

export async function down(qi: QueryInterface) {
  await qi.dropTable("payment_events");
}
