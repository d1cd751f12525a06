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

/** `readings` (0001-core): a steward's or a sensor's measurement at a digester. */
export class ReadingModel extends Model<InferAttributes<ReadingModel>, InferCreationAttributes<ReadingModel>> {
  declare id: CreationOptional<number>;
  declare digesterId: number;
  declare takenAt: Date;
  declare temperatureC: number | null;
  declare ph: number | null;
  declare vfaTaRatio: number | null;
  declare titrationAMl: number | null;
  declare titrationBMl: number | null;
  declare gasLevelPercent: number | null;
  declare drumRiseM: number | null;
  declare gasUsedMinutes: number | null;
  declare note: string | null;
  declare source: CreationOptional<"manual" | "upload">;
  declare personId: number | null;
  declare createdAt: CreationOptional<Date>;

  declare person?: NonAttribute<PersonModel | null>;

  static initModel(sequelize: Sequelize) {
    ReadingModel.init(
      withNumbers({
        id: { type: DataTypes.BIGINT, primaryKey: true, autoIncrement: true },
        digesterId: { type: DataTypes.INTEGER, allowNull: false },
        takenAt: { type: DataTypes.DATE, allowNull: false },
        temperatureC: { type: DataTypes.DECIMAL(5, 2) },
        ph: { type: DataTypes.DECIMAL(4, 2) },
        vfaTaRatio: { type: DataTypes.DECIMAL(5, 3) },
        titrationAMl: { type: DataTypes.DECIMAL(6, 2), field: "titration_a_ml" },
        titrationBMl: { type: DataTypes.DECIMAL(6, 2), field: "titration_b_ml" },
        gasLevelPercent: { type: DataTypes.DECIMAL(5, 1) },
        drumRiseM: { type: DataTypes.DECIMAL(5, 3) },
        gasUsedMinutes: { type: DataTypes.DECIMAL(6, 1) },
        note: { type: DataTypes.TEXT },
        source: { type: DataTypes.TEXT, allowNull: false, defaultValue: "manual" },
        personId: { type: DataTypes.INTEGER },
        createdAt: { type: DataTypes.DATE, allowNull: false },
      }),
      { sequelize, tableName: "readings", underscored: true, updatedAt: false },
    );
  }
}
