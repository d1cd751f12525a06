import { DataTypes, Model, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";

/** `rate_limit_hits` (0002): failed sign-ins per key in the current window, shared by every app process. */
export class RateLimitHitModel extends Model<
  InferAttributes<RateLimitHitModel>,
  InferCreationAttributes<RateLimitHitModel>
> {
  declare key: string;
  declare hits: number;
  declare resetAt: Date;

  static initModel(sequelize: Sequelize) {
    RateLimitHitModel.init(
      {
        key: { type: DataTypes.TEXT, primaryKey: true, allowNull: false },
        hits: { type: DataTypes.INTEGER, allowNull: false },
        resetAt: { type: DataTypes.DATE, allowNull: false },
      },
      { sequelize, tableName: "rate_limit_hits", underscored: true, timestamps: false },
    );
  }
}
