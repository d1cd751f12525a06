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
import type { PersonModel } from "./person.model";

/** `digesters` (0001-core): a digester's profile and status. */
export class DigesterModel extends Model<InferAttributes<DigesterModel>, InferCreationAttributes<DigesterModel>> {
  declare id: CreationOptional<number>;
  declare name: string;
  declare siteDescription: CreationOptional<string>;
  declare lat: number;
  declare lng: number;
  declare workingVolumeM3: number;
  declare drumDiameterM: number | null;
  declare drumMassKg: number | null;
  declare addedMassKg: CreationOptional<number>;
  declare burnerLitresPerHour: CreationOptional<number>;
  declare heating: CreationOptional<"none" | "solar" | "electric" | "waste-heat">;
  declare insulation: CreationOptional<"none" | "partial" | "full">;
  declare status: CreationOptional<"active" | "resting" | "offline">;
  declare statusReason: string | null;
  declare startedOn: string;
  declare gasFirstBurnedOn: string | null;
  declare olrRefKgVsPerM3Day: CreationOptional<number>;
  declare olrOverrideReason: string | null;
  declare targetTsPercent: CreationOptional<number>;
  declare bucketKgPerLitre: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  declare stewards?: NonAttribute<PersonModel[]>;

  static initModel(sequelize: Sequelize) {
    DigesterModel.init(
      withNumbers({
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        name: { type: DataTypes.TEXT, allowNull: false },
        siteDescription: { type: DataTypes.TEXT, allowNull: false, defaultValue: "" },
        lat: { type: DataTypes.DOUBLE, allowNull: false },
        lng: { type: DataTypes.DOUBLE, allowNull: false },
        workingVolumeM3: { type: DataTypes.DECIMAL(8, 3), allowNull: false },
        drumDiameterM: { type: DataTypes.DECIMAL(6, 3) },
        drumMassKg: { type: DataTypes.DECIMAL(8, 2) },
        addedMassKg: { type: DataTypes.DECIMAL(8, 2), allowNull: false, defaultValue: 0 },
        burnerLitresPerHour: { type: DataTypes.DECIMAL(8, 1), allowNull: false, defaultValue: 350 },
        heating: { type: DataTypes.TEXT, allowNull: false, defaultValue: "none" },
        insulation: { type: DataTypes.TEXT, allowNull: false, defaultValue: "none" },
        status: { type: DataTypes.TEXT, allowNull: false, defaultValue: "active" },
        statusReason: { type: DataTypes.TEXT },
        startedOn: { type: DataTypes.DATEONLY, allowNull: false },
        gasFirstBurnedOn: { type: DataTypes.DATEONLY },
        olrRefKgVsPerM3Day: { type: DataTypes.DECIMAL(5, 2), allowNull: false, defaultValue: 1.5 },
        olrOverrideReason: { type: DataTypes.TEXT },
        targetTsPercent: { type: DataTypes.DECIMAL(5, 2), allowNull: false, defaultValue: 8 },
        bucketKgPerLitre: { type: DataTypes.DECIMAL(4, 2), allowNull: false, defaultValue: 0.5 },
        createdAt: { type: DataTypes.DATE, allowNull: false },
        updatedAt: { type: DataTypes.DATE, allowNull: false },
      }),
      { sequelize, tableName: "digesters", underscored: true },
    );
  }
}
