import type { Sequelize } from "sequelize";
import { OutboxMessage, initOutboxMessage } from "./outbox-message.model";
import { PasswordResetToken, initPasswordResetToken } from "./password-reset-token.model";

/** The e-mail infrastructure's models (outbox, password reset tokens); called from initModels. */
export function initMailModels(sequelize: Sequelize): void {
  initOutboxMessage(sequelize);
  initPasswordResetToken(sequelize);
}

export { OutboxMessage, PasswordResetToken };
