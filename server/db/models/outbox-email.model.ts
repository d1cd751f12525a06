import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from "sequelize";
import { withNumbers } from "./columns";

/** `outbox_emails` (0001-core): an e-mail written in its cause's transaction and sent later. */
export class OutboxEmailModel extends Model<
  InferAttributes<OutboxEmailModel>,
  InferCreationAttributes<OutboxEmailModel>
> {
  declare id: CreationOptional<number>;
  declare toAddress: string;
  declare subject: string;
  declare textBody: string;
  declare htmlBody: string | null;
  declare messageId: string;
  declare status: CreationOptional<"pending" | "sent" | "failed">;
  declare attempts: CreationOptional<number>;
  declare nextAttemptAt: CreationOptional<Date>;
  declare lastError: CreationOptional<string | null>;
  declare dedupeKey: string | null;
  declare createdAt: CreationOptional<Date>;
  declare sentAt: CreationOptional<Date | null>;

  static initModel(sequelize: Sequelize) {
    OutboxEmailModel.init(
      withNumbers({
        id: { type: DataTypes.BIGINT, primaryKey: true, autoIncrement: true },
        toAddress: { type: DataTypes.TEXT, allowNull: false },
        subject: { type: DataTypes.TEXT, allowNull: false },
        textBody: { type: DataTypes.TEXT, allowNull: false },
        htmlBody: { type: DataTypes.TEXT },
        messageId: { type: DataTypes.TEXT, allowNull: false, unique: true },
        status: { type: DataTypes.TEXT, allowNull: false, defaultValue: "pending" },
        attempts: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        nextAttemptAt: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
        lastError: { type: DataTypes.TEXT },
        dedupeKey: { type: DataTypes.TEXT, unique: true },
        createdAt: { type: DataTypes.DATE, allowNull: false },
        sentAt: { type: DataTypes.DATE },
      }),
      { sequelize, tableName: "outbox_emails", underscored: true, updatedAt: false },
    );
  }
}
