import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type NonAttribute,
  type Sequelize,
} from "sequelize";
import { withNumbers } from "./columns";
import type { CollectionRoundStopModel } from "./collection-round-stop.model";

/** `collection_rounds` (0005, 0006 reminded_at): a volunteer's cargo-bike round on a date, ending at a digester. */
export class CollectionRoundModel extends Model<
  InferAttributes<CollectionRoundModel>,
  InferCreationAttributes<CollectionRoundModel>
> {
  declare id: CreationOptional<number>;
  declare forDate: string;
  declare volunteerId: number;
  declare endDigesterId: number;
  declare totalM: number;
  declare loadKg: CreationOptional<number>;
  declare status: CreationOptional<"planned" | "done" | "cancelled">;
  declare remindedAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  declare stops?: NonAttribute<CollectionRoundStopModel[]>;

  static initModel(sequelize: Sequelize) {
    CollectionRoundModel.init(
      withNumbers({
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        forDate: { type: DataTypes.DATEONLY, allowNull: false },
        volunteerId: { type: DataTypes.INTEGER, allowNull: false },
        endDigesterId: { type: DataTypes.INTEGER, allowNull: false },
        totalM: { type: DataTypes.DECIMAL(10, 1), allowNull: false },
        loadKg: { type: DataTypes.DECIMAL(8, 2), allowNull: false, defaultValue: 0 },
        status: { type: DataTypes.TEXT, allowNull: false, defaultValue: "planned" },
        remindedAt: { type: DataTypes.DATE },
        createdAt: { type: DataTypes.DATE, allowNull: false },
        updatedAt: { type: DataTypes.DATE, allowNull: false },
      }),
      { sequelize, tableName: "collection_rounds", underscored: true },
    );
  }
}
