import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from "sequelize";

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

  static initModel(sequelize: Sequelize) {
    HouseholdModel.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        name: { type: DataTypes.TEXT, allowNull: false },
        addressText: { type: DataTypes.TEXT, allowNull: false, defaultValue: "" },
        lat: { type: DataTypes.DOUBLE },
        lng: { type: DataTypes.DOUBLE },
        assignedDigesterId: { type: DataTypes.INTEGER },
        assignmentPinned: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
        declaredWeeklyKg: { type: DataTypes.DECIMAL(8, 2), allowNull: false, defaultValue: 3 },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: "households", underscored: true },
    );
  }
}
