import {
  DataTypes,
  Model,
  type InferAttributes,
  type InferCreationAttributes,
  type NonAttribute,
  type Sequelize,
} from "sequelize";
import type { CollectionRequestModel } from "./collection-request.model";

/** `collection_round_stops` (0005): a request as the `seq`-th stop of a round, and the drop-off its collection made. */
export class CollectionRoundStopModel extends Model<
  InferAttributes<CollectionRoundStopModel>,
  InferCreationAttributes<CollectionRoundStopModel>
> {
  declare roundId: number;
  declare requestId: number;
  declare seq: number;
  declare dropOffId: number | null;

  declare request?: NonAttribute<CollectionRequestModel>;

  static initModel(sequelize: Sequelize) {
    CollectionRoundStopModel.init(
      {
        roundId: { type: DataTypes.INTEGER, primaryKey: true, allowNull: false },
        requestId: { type: DataTypes.INTEGER, primaryKey: true, allowNull: false },
        seq: { type: DataTypes.INTEGER, allowNull: false },
        dropOffId: { type: DataTypes.INTEGER },
      },
      { sequelize, tableName: "collection_round_stops", underscored: true, timestamps: false },
    );
  }
}
