import { DataTypes, type QueryInterface } from "sequelize";

/** The office PDF of an approved (frozen) revision, rendered once and kept with its SHA-256. */
export async function up(qi: QueryInterface) {
  await qi.createTable("revision_pdfs", {
    revision_id: { type: DataTypes.INTEGER.UNSIGNED, primaryKey: true, references: { model: "quote_revisions", key: "id" }, onDelete: "CASCADE" },
    company_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, references: { model: "companies", key: "id" }, onDelete: "RESTRICT" },
    pdf_key: { type: DataTypes.STRING(80), allowNull: false },
    pdf_sha256: { type: DataTypes.CHAR(64), allowNull: false },
    created_at: { type: DataTypes.DATE, allowNull: false },
  });
}

export async function down(qi: QueryInterface) {
  await qi.dropTable("revision_pdfs");
}
