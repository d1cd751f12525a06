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
import type { PersonModel } from "./person.model";

/** `households` (0001-core): a household's place, declared amount and assigned digester. */
export class HouseholdModel extends Model<InferAttributes<HouseholdModel>, InferCreationAttributes<HouseholdModel>> {
  declare id: CreationOptional<number>;
  declare name: string;
  declare addressText: CreationOptional<string>;
  declare lat: number | null;
  declare lng: number | null;
  declare assignedDigesterId: number | null;
  declare assignmentPinned: CreationOptional<boolean>;
  declare declaredWeeklyKg: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  declare assignedDigester?: NonAttribute<DigesterModel | null>;
  declare members?: NonAttribute<PersonModel[]>;

  static initModel(sequelize: Sequelize) {
    HouseholdModel.init(
      withNumbers({
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        name: { type: DataTypes.TEXT, allowNull: false },
        addressText: { type: DataTypes.TEXT, allowNull: false, defaultValue: "" },
        lat: { type: DataTypes.DOUBLE },
        lng: { type: DataTypes.DOUBLE },
        assignedDigesterId: { type: DataTypes.INTEGER },
        assignmentPinned: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
        declaredWeeklyKg: { type: DataTypes.DECIMAL(8, 2), allowNull: false, defaultValue: 3 },
        createdAt: { type: DataTypes.DATE, allowNull: false },
        updatedAt: { type: DataTypes.DATE, allowNull: false },
      }),
      { sequelize, tableName: "households", underscored: true },
    );
  }
}
