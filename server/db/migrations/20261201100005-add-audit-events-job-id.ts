import { DataTypes, type QueryInterface } from "sequelize";

/** Events that concern a job (the job itself, its roof, later its quotes) carry its id for the job's log. */
export async function up(qi: QueryInterface) {
  await qi.addColumn("audit_events", "job_id", { type: DataTypes.INTEGER.UNSIGNED, allowNull: true });
  await qi.addIndex("audit_events", ["company_id", "job_id", "created_at"], { name: "audit_events_job_time" });
}

export async function down(qi: QueryInterface) {
  await qi.removeIndex("audit_events", "audit_events_job_time");
  await qi.removeColumn("audit_events", "job_id");
}
