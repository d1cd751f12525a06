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
import type { DropOffModel, ScrapMix } from "./drop-off.model";
import type { PersonModel } from "./person.model";

/** `feedings` (0001-core, 0004 mix and citrus): scraps that went into a digester. */
export class FeedingModel extends Model<InferAttributes<FeedingModel>, InferCreationAttributes<FeedingModel>> {
  declare id: CreationOptional<number>;
  declare digesterId: number;
  declare fedOn: string;
  declare fedAt: CreationOptional<Date>;
  declare freshKg: number;
  declare kgVs: number;
  declare waterLitres: CreationOptional<number>;
  declare dropOffId: number | null;
  declare personId: number | null;
  declare overrideReason: string | null;
  declare note: string | null;
  declare mix: CreationOptional<ScrapMix | null>;
  declare citrusPercent: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;

  declare dropOff?: NonAttribute<DropOffModel | null>;
  declare person?: NonAttribute<PersonModel | null>;

  static initModel(sequelize: Sequelize) {
    FeedingModel.init(
      withNumbers({
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        digesterId: { type: DataTypes.INTEGER, allowNull: false },
        fedOn: { type: DataTypes.DATEONLY, allowNull: false },
        fedAt: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
        freshKg: { type: DataTypes.DECIMAL(8, 3), allowNull: false },
        kgVs: { type: DataTypes.DECIMAL(8, 4), allowNull: false },
        waterLitres: { type: DataTypes.DECIMAL(8, 2), allowNull: false, defaultValue: 0 },
        dropOffId: { type: DataTypes.INTEGER },
        personId: { type: DataTypes.INTEGER },
        overrideReason: { type: DataTypes.TEXT },
        note: { type: DataTypes.TEXT },
        mix: { type: DataTypes.TEXT },
        citrusPercent: { type: DataTypes.DECIMAL(5, 2), allowNull: false, defaultValue: 0 },
        createdAt: { type: DataTypes.DATE, allowNull: false },
      }),
      { sequelize, tableName: "feedings", underscored: true, updatedAt: false },
    );
  }
}
