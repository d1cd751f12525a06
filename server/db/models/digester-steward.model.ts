import { DataTypes, Model, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";

/** `digester_stewards` (0001-core): who looks after which digester (the join of a many-to-many). */
export class DigesterStewardModel extends Model<
  InferAttributes<DigesterStewardModel>,
  InferCreationAttributes<DigesterStewardModel>
> {
  declare digesterId: number;
  declare personId: number;

  static initModel(sequelize: Sequelize) {
    DigesterStewardModel.init(
      {
        digesterId: { type: DataTypes.INTEGER, primaryKey: true, allowNull: false },
        personId: { type: DataTypes.INTEGER, primaryKey: true, allowNull: false },
      },
      { sequelize, tableName: "digester_stewards", underscored: true, timestamps: false },
    );
  }
}
