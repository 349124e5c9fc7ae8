import type { Sequelize } from "sequelize";
import { Company, initCompany } from "./company.model";
import { User, initUser } from "./user.model";
import { Session, initSession } from "./session.model";
import { AuditEvent, initAuditEvent } from "./audit-event.model";

let initialisedWith: Sequelize | null = null;

/** Binds every model to one Sequelize instance (once per process) and sets up associations. */
export function initModels(sequelize: Sequelize): void {
  if (initialisedWith === sequelize) return;
  initCompany(sequelize);
  initUser(sequelize);
  initSession(sequelize);
  initAuditEvent(sequelize);
  Company.hasMany(User, { foreignKey: "companyId" });
  User.belongsTo(Company, { foreignKey: "companyId" });
  initialisedWith = sequelize;
}

export { Company, User, Session, AuditEvent };
