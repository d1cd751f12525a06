import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from "sequelize";
import { withNumbers } from "./columns";

/**
 * `digester_days` (0004): the daily ledger. `committedKgVs` is kept by triggers on drop_offs and
 * feedings; the app only stamps `capKgVs` and adds to `overrideKgVs`.
 */
export class DigesterDayModel extends Model<
  InferAttributes<DigesterDayModel>,
  InferCreationAttributes<DigesterDayModel>
> {
  declare digesterId: number;
  declare day: string;
  declare committedKgVs: CreationOptional<number>;
  declare capKgVs: number | null;
  declare overrideKgVs: CreationOptional<number>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    DigesterDayModel.init(
      withNumbers({
        digesterId: { type: DataTypes.INTEGER, primaryKey: true, allowNull: false },
        day: { type: DataTypes.DATEONLY, primaryKey: true, allowNull: false },
        committedKgVs: { type: DataTypes.DECIMAL(12, 4), allowNull: false, defaultValue: 0 },
        capKgVs: { type: DataTypes.DECIMAL(12, 4) },
        overrideKgVs: { type: DataTypes.DECIMAL(12, 4), allowNull: false, defaultValue: 0 },
        updatedAt: { type: DataTypes.DATE, allowNull: false },
      }),
      { sequelize, tableName: "digester_days", underscored: true, createdAt: false },
    );
  }
}
