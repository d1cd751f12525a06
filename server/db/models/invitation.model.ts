import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type NonAttribute,
  type Sequelize,
} from "sequelize";
import type { PersonModel, Role } from "./person.model";

/** `invitations` (0001-core, 0002 person_id): a one-time link (only its hash) that activates an invited person. */
export class InvitationModel extends Model<InferAttributes<InvitationModel>, InferCreationAttributes<InvitationModel>> {
  declare id: CreationOptional<number>;
  declare tokenHash: string;
  declare email: string;
  declare name: CreationOptional<string>;
  declare roles: CreationOptional<Role[]>;
  declare invitedBy: number | null;
  declare expiresAt: Date;
  declare usedAt: CreationOptional<Date | null>;
  declare personId: number | null;
  declare createdAt: CreationOptional<Date>;

  declare person?: NonAttribute<PersonModel | null>;

  static initModel(sequelize: Sequelize) {
    InvitationModel.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        tokenHash: { type: DataTypes.TEXT, allowNull: false, unique: true },
        email: { type: DataTypes.CITEXT, allowNull: false },
        name: { type: DataTypes.TEXT, allowNull: false, defaultValue: "" },
        roles: { type: DataTypes.ARRAY(DataTypes.TEXT), allowNull: false, defaultValue: [] },
        invitedBy: { type: DataTypes.INTEGER },
        expiresAt: { type: DataTypes.DATE, allowNull: false },
        usedAt: { type: DataTypes.DATE },
        personId: { type: DataTypes.INTEGER },
        createdAt: { type: DataTypes.DATE, allowNull: false },
      },
      { sequelize, tableName: "invitations", underscored: true, updatedAt: false },
    );
  }
}
