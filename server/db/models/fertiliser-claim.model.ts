import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from "sequelize";
import { withNumbers } from "./columns";

/** `fertiliser_claims` (0001-core): a gardener's claim on a digester's liquid fertiliser. */
export class FertiliserClaimModel extends Model<
  InferAttributes<FertiliserClaimModel>,
  InferCreationAttributes<FertiliserClaimModel>
> {
  declare id: CreationOptional<number>;
  declare digesterId: number;
  declare personId: number;
  declare litres: number;
  declare windowStart: Date;
  declare windowEnd: Date;
  declare bedAreaM2: number | null;
  declare status: CreationOptional<"claimed" | "collected" | "cancelled">;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    FertiliserClaimModel.init(
      withNumbers({
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        digesterId: { type: DataTypes.INTEGER, allowNull: false },
        personId: { type: DataTypes.INTEGER, allowNull: false },
        litres: { type: DataTypes.DECIMAL(8, 1), allowNull: false },
        windowStart: { type: DataTypes.DATE, allowNull: false },
        windowEnd: { type: DataTypes.DATE, allowNull: false },
        bedAreaM2: { type: DataTypes.DECIMAL(8, 1) },
        status: { type: DataTypes.TEXT, allowNull: false, defaultValue: "claimed" },
        createdAt: { type: DataTypes.DATE, allowNull: false },
        updatedAt: { type: DataTypes.DATE, allowNull: false },
      }),
      { sequelize, tableName: "fertiliser_claims", underscored: true },
    );
  }
}
