import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type NonAttribute,
  type Sequelize,
} from "sequelize";
import type { PersonModel } from "./person.model";

/** `password_resets` (0001-core): a one-time reset link (only its hash) for a person. */
export class PasswordResetModel extends Model<
  InferAttributes<PasswordResetModel>,
  InferCreationAttributes<PasswordResetModel>
> {
  declare id: CreationOptional<number>;
  declare tokenHash: string;
  declare personId: number;
  declare expiresAt: Date;
  declare usedAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;

  declare person?: NonAttribute<PersonModel>;

  static initModel(sequelize: Sequelize) {
    PasswordResetModel.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        tokenHash: { type: DataTypes.TEXT, allowNull: false, unique: true },
        personId: { type: DataTypes.INTEGER, allowNull: false },
        expiresAt: { type: DataTypes.DATE, allowNull: false },
        usedAt: { type: DataTypes.DATE },
        createdAt: { type: DataTypes.DATE, allowNull: false },
      },
      { sequelize, tableName: "password_resets", underscored: true, updatedAt: false },
    );
  }
}
