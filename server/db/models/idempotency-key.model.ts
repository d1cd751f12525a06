import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from "sequelize";

/** `idempotency_keys` (0001-core): the first answer to a POST sent with an Idempotency-Key. */
export class IdempotencyKeyModel extends Model<
  InferAttributes<IdempotencyKeyModel>,
  InferCreationAttributes<IdempotencyKeyModel>
> {
  declare personId: number;
  declare key: string;
  declare route: string;
  declare requestHash: string;
  declare statusCode: number;
  declare response: unknown;
  declare createdAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    IdempotencyKeyModel.init(
      {
        personId: { type: DataTypes.INTEGER, primaryKey: true, allowNull: false },
        key: { type: DataTypes.TEXT, primaryKey: true, allowNull: false },
        route: { type: DataTypes.TEXT, allowNull: false },
        requestHash: { type: DataTypes.TEXT, allowNull: false },
        statusCode: { type: DataTypes.INTEGER, allowNull: false },
        response: { type: DataTypes.JSONB, allowNull: false },
        createdAt: { type: DataTypes.DATE, allowNull: false },
      },
      { sequelize, tableName: "idempotency_keys", underscored: true, updatedAt: false },
    );
  }
}
