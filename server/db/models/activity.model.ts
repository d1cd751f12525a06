import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from "sequelize";

export type ScrapMix = "mixed" | "fruitVeg" | "cooked" | "breadGrains" | "coffee";
export type DropOffStatus = "pending" | "accepted" | "fed" | "turned_away" | "cancelled";

export class DropOffModel extends Model<InferAttributes<DropOffModel>, InferCreationAttributes<DropOffModel>> {
  declare id: CreationOptional<number>;
  declare householdId: number;
  declare digesterId: number;
  declare personId: number | null;
  declare forDate: string;
  declare bucketCount: number | null;
  declare bucketLitres: number | null;
  declare weightKg: number | null;
  declare massSource: "weighed" | "estimated";
  declare freshKg: number;
  declare kgVs: number;
  declare mix: CreationOptional<ScrapMix>;
  declare citrusPercent: CreationOptional<number>;
  declare status: CreationOptional<DropOffStatus>;
  declare turnedAwayReason: "contamination" | "too_much_citrus" | "over_budget" | "other" | null;
  declare note: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    DropOffModel.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        householdId: { type: DataTypes.INTEGER, allowNull: false },
        digesterId: { type: DataTypes.INTEGER, allowNull: false },
        personId: { type: DataTypes.INTEGER },
        forDate: { type: DataTypes.DATEONLY, allowNull: false },
        bucketCount: { type: DataTypes.INTEGER },
        bucketLitres: { type: DataTypes.DECIMAL(5, 1) },
        weightKg: { type: DataTypes.DECIMAL(7, 2) },
        massSource: { type: DataTypes.TEXT, allowNull: false },
        freshKg: { type: DataTypes.DECIMAL(8, 3), allowNull: false },
        kgVs: { type: DataTypes.DECIMAL(8, 4), allowNull: false },
        mix: { type: DataTypes.TEXT, allowNull: false, defaultValue: "mixed" },
        citrusPercent: { type: DataTypes.DECIMAL(5, 2), allowNull: false, defaultValue: 0 },
        status: { type: DataTypes.TEXT, allowNull: false, defaultValue: "pending" },
        turnedAwayReason: { type: DataTypes.TEXT },
        note: { type: DataTypes.TEXT },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: "drop_offs", underscored: true },
    );
  }
}

export class FeedingModel extends Model<InferAttributes<FeedingModel>, InferCreationAttributes<FeedingModel>> {
  declare id: CreationOptional<number>;
  declare digesterId: number;
  declare fedOn: string;
  declare fedAt: CreationOptional<Date>;
  declare freshKg: number;
  declare kgVs: number;
  declare waterLitres: CreationOptional<number>;
  declare dropOffId: number | null;
  declare personId: number | null;
  declare overrideReason: string | null;
  declare note: string | null;
  declare createdAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    FeedingModel.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        digesterId: { type: DataTypes.INTEGER, allowNull: false },
        fedOn: { type: DataTypes.DATEONLY, allowNull: false },
        fedAt: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
        freshKg: { type: DataTypes.DECIMAL(8, 3), allowNull: false },
        kgVs: { type: DataTypes.DECIMAL(8, 4), allowNull: false },
        waterLitres: { type: DataTypes.DECIMAL(8, 2), allowNull: false, defaultValue: 0 },
        dropOffId: { type: DataTypes.INTEGER },
        personId: { type: DataTypes.INTEGER },
        overrideReason: { type: DataTypes.TEXT },
        note: { type: DataTypes.TEXT },
        createdAt: DataTypes.DATE,
      },
      { sequelize, tableName: "feedings", underscored: true, updatedAt: false },
    );
  }
}

export class ReadingModel extends Model<InferAttributes<ReadingModel>, InferCreationAttributes<ReadingModel>> {
  declare id: CreationOptional<number>;
  declare digesterId: number;
  declare takenAt: Date;
  declare temperatureC: number | null;
  declare ph: number | null;
  declare vfaTaRatio: number | null;
  declare titrationAMl: number | null;
  declare titrationBMl: number | null;
  declare gasLevelPercent: number | null;
  declare drumRiseM: number | null;
  declare gasUsedMinutes: number | null;
  declare note: string | null;
  declare source: CreationOptional<"manual" | "upload">;
  declare personId: number | null;
  declare createdAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    ReadingModel.init(
      {
        id: { type: DataTypes.BIGINT, primaryKey: true, autoIncrement: true },
        digesterId: { type: DataTypes.INTEGER, allowNull: false },
        takenAt: { type: DataTypes.DATE, allowNull: false },
        temperatureC: { type: DataTypes.DECIMAL(5, 2) },
        ph: { type: DataTypes.DECIMAL(4, 2) },
        vfaTaRatio: { type: DataTypes.DECIMAL(5, 3) },
        titrationAMl: { type: DataTypes.DECIMAL(6, 2), field: "titration_a_ml" },
        titrationBMl: { type: DataTypes.DECIMAL(6, 2), field: "titration_b_ml" },
        gasLevelPercent: { type: DataTypes.DECIMAL(5, 1) },
        drumRiseM: { type: DataTypes.DECIMAL(5, 3) },
        gasUsedMinutes: { type: DataTypes.DECIMAL(6, 1) },
        note: { type: DataTypes.TEXT },
        source: { type: DataTypes.TEXT, allowNull: false, defaultValue: "manual" },
        personId: { type: DataTypes.INTEGER },
        createdAt: DataTypes.DATE,
      },
      { sequelize, tableName: "readings", underscored: true, updatedAt: false },
    );
  }
}

export class FertiliserClaimModel extends Model<
  InferAttributes<FertiliserClaimModel>,
  InferCreationAttributes<FertiliserClaimModel>
> {
  declare id: CreationOptional<number>;
  declare digesterId: number;
  declare personId: number;
  declare litres: number;
  declare windowStart: Date;
  declare windowEnd: Date;
  declare bedAreaM2: number | null;
  declare status: CreationOptional<"claimed" | "collected" | "cancelled">;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    FertiliserClaimModel.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        digesterId: { type: DataTypes.INTEGER, allowNull: false },
        personId: { type: DataTypes.INTEGER, allowNull: false },
        litres: { type: DataTypes.DECIMAL(8, 1), allowNull: false },
        windowStart: { type: DataTypes.DATE, allowNull: false },
        windowEnd: { type: DataTypes.DATE, allowNull: false },
        bedAreaM2: { type: DataTypes.DECIMAL(8, 1) },
        status: { type: DataTypes.TEXT, allowNull: false, defaultValue: "claimed" },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: "fertiliser_claims", underscored: true },
    );
  }
}

export class CollectionRequestModel extends Model<
  InferAttributes<CollectionRequestModel>,
  InferCreationAttributes<CollectionRequestModel>
> {
  declare id: CreationOptional<number>;
  declare householdId: number;
  declare forDate: string;
  declare bucketCount: number;
  declare status: CreationOptional<"open" | "planned" | "collected" | "cancelled">;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    CollectionRequestModel.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        householdId: { type: DataTypes.INTEGER, allowNull: false },
        forDate: { type: DataTypes.DATEONLY, allowNull: false },
        bucketCount: { type: DataTypes.INTEGER, allowNull: false },
        status: { type: DataTypes.TEXT, allowNull: false, defaultValue: "open" },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: "collection_requests", underscored: true },
    );
  }
}
