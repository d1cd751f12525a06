import { DataTypes, Model, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";

/**
 * `sessions` (0001-core): connect-pg-simple's table, in its own column types (`varchar` without a length and
 * `timestamp(6)` without time zone, which Sequelize has no type for, hence the SQL type text).
 */
export class SessionModel extends Model<InferAttributes<SessionModel>, InferCreationAttributes<SessionModel>> {
  declare sid: string;
  declare sess: unknown;
  declare expire: Date;

  static initModel(sequelize: Sequelize) {
    SessionModel.init(
      {
        sid: { type: "VARCHAR", primaryKey: true, allowNull: false },
        sess: { type: DataTypes.JSON, allowNull: false },
        expire: { type: "TIMESTAMP(6) WITHOUT TIME ZONE", allowNull: false },
      },
      { sequelize, tableName: "sessions", timestamps: false },
    );
  }
}
