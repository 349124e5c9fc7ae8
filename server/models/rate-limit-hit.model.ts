import { DataTypes, Model, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";

/** One rate limiter's hit counter for one client key (see server/middleware/rate-limit-store.ts). */
export class RateLimitHit extends Model<InferAttributes<RateLimitHit>, InferCreationAttributes<RateLimitHit>> {
  /** `<prefix>:<client key>`, or `<prefix>:sha256:<hex>` for a long or non-ASCII key. */
  declare key: string;
  declare hits: number;
  /** End of the current window (the database's clock). */
  declare resetAt: Date;
}

export const RATE_LIMIT_TABLE = "rate_limit_hits";

export const initRateLimitHit = (sequelize: Sequelize) =>
  RateLimitHit.init(
    {
      key: { type: DataTypes.STRING(191).BINARY, primaryKey: true },
      hits: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
      resetAt: { type: DataTypes.DATE(3), allowNull: false },
    },
    { sequelize, tableName: RATE_LIMIT_TABLE, underscored: true, timestamps: false, modelName: "RateLimitHit" },
  );
