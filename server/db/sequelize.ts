import { Sequelize } from "sequelize";
import type { Config } from "../config";

export function createSequelize(db: Config["db"]): Sequelize {
  return new Sequelize({
    dialect: "mariadb",
    host: db.host,
    port: db.port,
    database: db.database,
    username: db.user,
    password: db.password,
    logging: false,
    pool: { max: db.poolMax, min: 0, acquire: 10_000, idle: 10_000 },
    dialectOptions: { connectTimeout: 5_000 },
    timezone: "+00:00",
    define: { underscored: true },
  });
}
