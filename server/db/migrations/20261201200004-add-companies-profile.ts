import { DataTypes, type QueryInterface } from "sequelize";

/** The company profile printed on proposals and e-mails, and the proposal numbering. */
const COLUMNS = {
  legal_name: { type: DataTypes.STRING(200), allowNull: true },
  logo_attachment_key: { type: DataTypes.STRING(200), allowNull: true },
  licence_number: { type: DataTypes.STRING(60), allowNull: true },
  address_line1: { type: DataTypes.STRING(160), allowNull: true },
  address_line2: { type: DataTypes.STRING(160), allowNull: true },
  city: { type: DataTypes.STRING(80), allowNull: true },
  region: { type: DataTypes.STRING(80), allowNull: true },
  postal_code: { type: DataTypes.STRING(20), allowNull: true },
  phone: { type: DataTypes.STRING(40), allowNull: true },
  email: { type: DataTypes.STRING(254), allowNull: true },
  website: { type: DataTypes.STRING(200), allowNull: true },
  proposal_terms: { type: DataTypes.TEXT, allowNull: true },
  exclusions: { type: DataTypes.TEXT, allowNull: true },
  warranty: { type: DataTypes.TEXT, allowNull: true },
  proposal_prefix: { type: DataTypes.STRING(12), allowNull: false, defaultValue: "" },
  next_proposal_number: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 1 },
};

export async function up(qi: QueryInterface) {
  for (const [name, spec] of Object.entries(COLUMNS)) await qi.addColumn("companies", name, spec);
}

export async function down(qi: QueryInterface) {
  for (const name of Object.keys(COLUMNS).reverse()) await qi.removeColumn("companies", name);
}
