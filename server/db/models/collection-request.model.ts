import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type NonAttribute,
  type Sequelize,
} from "sequelize";
import type { CollectionRoundStopModel } from "./collection-round-stop.model";
import type { HouseholdModel } from "./household.model";

/** `collection_requests` (0001-core): a household asking for its buckets to be collected on a date. */
export class CollectionRequestModel extends Model<
  InferAttributes<CollectionRequestModel>,
  InferCreationAttributes<CollectionRequestModel>
> {
  declare id: CreationOptional<number>;
  declare householdId: number;
  declare forDate: string;
  declare bucketCount: number;
  declare status: CreationOptional<"open" | "planned" | "collected" | "cancelled">;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  declare household?: NonAttribute<HouseholdModel>;
  declare stop?: NonAttribute<CollectionRoundStopModel | null>;

  static initModel(sequelize: Sequelize) {
    CollectionRequestModel.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        householdId: { type: DataTypes.INTEGER, allowNull: false },
        forDate: { type: DataTypes.DATEONLY, allowNull: false },
        bucketCount: { type: DataTypes.INTEGER, allowNull: false },
        status: { type: DataTypes.TEXT, allowNull: false, defaultValue: "open" },
        createdAt: { type: DataTypes.DATE, allowNull: false },
        updatedAt: { type: DataTypes.DATE, allowNull: false },
      },
      { sequelize, tableName: "collection_requests", underscored: true },
    );
  }
}
