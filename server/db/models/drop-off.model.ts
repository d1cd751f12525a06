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
import type { DigesterModel } from "./digester.model";
import type { FeedingModel } from "./feeding.model";
import type { HouseholdModel } from "./household.model";
import type { PersonModel } from "./person.model";

export type ScrapMix = "mixed" | "fruitVeg" | "cooked" | "breadGrains" | "coffee";
export type DropOffStatus = "pending" | "accepted" | "fed" | "turned_away" | "cancelled";

/** `drop_offs` (0001-core, 0003 no_refuse_confirmed, 0004 the steward's decision): a household's scraps for a digester. */
export class DropOffModel extends Model<InferAttributes<DropOffModel>, InferCreationAttributes<DropOffModel>> {
  declare id: CreationOptional<number>;
  declare householdId: number;
  declare digesterId: number;
  declare personId: number | null;
  declare forDate: string;
  declare bucketCount: number | null;
  declare bucketLitres: number | null;
  declare weightKg: number | null;
  declare massSource: "weighed" | "estimated";
  declare freshKg: number;
  declare kgVs: number;
  declare mix: CreationOptional<ScrapMix>;
  declare citrusPercent: CreationOptional<number>;
  declare status: CreationOptional<DropOffStatus>;
  declare turnedAwayReason: "contamination" | "too_much_citrus" | "over_budget" | "other" | null;
  declare note: string | null;
  declare noRefuseConfirmed: CreationOptional<boolean>;
  declare handledByPersonId: CreationOptional<number | null>;
  declare handledAt: CreationOptional<Date | null>;
  declare overrideReason: CreationOptional<string | null>;
  declare stewardNote: CreationOptional<string | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  declare digester?: NonAttribute<DigesterModel>;
  declare household?: NonAttribute<HouseholdModel>;
  declare person?: NonAttribute<PersonModel | null>;
  declare feeding?: NonAttribute<FeedingModel | null>;

  static initModel(sequelize: Sequelize) {
    DropOffModel.init(
      withNumbers({
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        householdId: { type: DataTypes.INTEGER, allowNull: false },
        digesterId: { type: DataTypes.INTEGER, allowNull: false },
        personId: { type: DataTypes.INTEGER },
        forDate: { type: DataTypes.DATEONLY, allowNull: false },
        bucketCount: { type: DataTypes.INTEGER },
        bucketLitres: { type: DataTypes.DECIMAL(5, 1) },
        weightKg: { type: DataTypes.DECIMAL(7, 2) },
        massSource: { type: DataTypes.TEXT, allowNull: false },
        freshKg: { type: DataTypes.DECIMAL(8, 3), allowNull: false },
        kgVs: { type: DataTypes.DECIMAL(8, 4), allowNull: false },
        mix: { type: DataTypes.TEXT, allowNull: false, defaultValue: "mixed" },
        citrusPercent: { type: DataTypes.DECIMAL(5, 2), allowNull: false, defaultValue: 0 },
        status: { type: DataTypes.TEXT, allowNull: false, defaultValue: "pending" },
        turnedAwayReason: { type: DataTypes.TEXT },
        note: { type: DataTypes.TEXT },
        noRefuseConfirmed: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
        handledByPersonId: { type: DataTypes.INTEGER },
        handledAt: { type: DataTypes.DATE },
        overrideReason: { type: DataTypes.TEXT },
        stewardNote: { type: DataTypes.TEXT },
        createdAt: { type: DataTypes.DATE, allowNull: false },
        updatedAt: { type: DataTypes.DATE, allowNull: false },
      }),
      { sequelize, tableName: "drop_offs", underscored: true },
    );
  }
}
