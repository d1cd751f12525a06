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
import type { HouseholdModel } from "./household.model";

export type Role = "resident" | "steward" | "coordinator" | "gardener";

/** `people` (0001-core): an account, its roles, household and cargo bike. */
export class PersonModel extends Model<InferAttributes<PersonModel>, InferCreationAttributes<PersonModel>> {
  declare id: CreationOptional<number>;
  declare email: string;
  declare name: string;
  declare passwordHash: string | null;
  declare status: CreationOptional<"invited" | "active" | "disabled">;
  declare roles: CreationOptional<Role[]>;
  declare householdId: number | null;
  declare isVolunteer: CreationOptional<boolean>;
  declare bikeLoadKg: number | null;
  declare startLat: number | null;
  declare startLng: number | null;
  declare passwordChangedAt: Date | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  declare household?: NonAttribute<HouseholdModel | null>;
  declare stewardedDigesters?: NonAttribute<DigesterModel[]>;

  static initModel(sequelize: Sequelize) {
    PersonModel.init(
      withNumbers({
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        email: { type: DataTypes.CITEXT, allowNull: false, unique: true },
        name: { type: DataTypes.TEXT, allowNull: false },
        passwordHash: { type: DataTypes.TEXT },
        status: { type: DataTypes.TEXT, allowNull: false, defaultValue: "active" },
        roles: { type: DataTypes.ARRAY(DataTypes.TEXT), allowNull: false, defaultValue: [] },
        householdId: { type: DataTypes.INTEGER },
        isVolunteer: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
        bikeLoadKg: { type: DataTypes.DECIMAL(6, 1) },
        startLat: { type: DataTypes.DOUBLE },
        startLng: { type: DataTypes.DOUBLE },
        passwordChangedAt: { type: DataTypes.DATE },
        createdAt: { type: DataTypes.DATE, allowNull: false },
        updatedAt: { type: DataTypes.DATE, allowNull: false },
      }),
      { sequelize, tableName: "people", underscored: true },
    );
  }
}
