import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from "sequelize";

/**
 * `password_reset_requests` (0007): an address typed into the reset form, known or not, waiting
 * for the reset job to look it up; deleted once handled.
 */
export class PasswordResetRequestModel extends Model<
  InferAttributes<PasswordResetRequestModel>,
  InferCreationAttributes<PasswordResetRequestModel>
> {
  declare id: CreationOptional<number>;
  declare email: string;
  declare requestedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    PasswordResetRequestModel.init(
      {
        id: { type: DataTypes.BIGINT, primaryKey: true, autoIncrement: true },
        email: { type: DataTypes.TEXT, allowNull: false },
        requestedAt: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
      },
      { sequelize, tableName: "password_reset_requests", underscored: true, timestamps: false },
    );
  }
}
