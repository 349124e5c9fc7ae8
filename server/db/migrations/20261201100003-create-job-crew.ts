import { DataTypes, type QueryInterface } from "sequelize";

export async function up(qi: QueryInterface) {
  await qi.createTable("job_crew", {
    job_id: {
      type: DataTypes.INTEGER.UNSIGNED,
      allowNull: false,
      primaryKey: true,
      references: { model: "jobs", key: "id" },
      onDelete: "CASCADE",
    },
    user_id: {
      type: DataTypes.INTEGER.UNSIGNED,
      allowNull: false,
      primaryKey: true,
      references: { model: "users", key: "id" },
      onDelete: "CASCADE",
    },
    created_at: { type: DataTypes.DATE, allowNull: false },
  });
  // "Jobs assigned to me" for crew: look up by user first.
  await qi.addIndex("job_crew", ["user_id", "job_id"], { name: "job_crew_user_job" });
}

export async function down(qi: QueryInterface) {
  await qi.dropTable("job_crew");
}
