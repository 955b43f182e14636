import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute, type Sequelize } from 'sequelize';
import type { User } from './user';

export class Site extends Model<InferAttributes<Site>, InferCreationAttributes<Site>> {
  declare id: CreationOptional<number>;
  declare neighbourhoodId: number;
  declare name: string;
  declare latitude: number;
  declare longitude: number;
  declare groundElevationM: CreationOptional<number>;
  declare antennaHeightM: CreationOptional<number>;
  declare accessNotes: CreationOptional<string | null>;
  declare hostUserId: CreationOptional<number | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare host?: NonAttribute<User | null>;

  static initModel(sequelize: Sequelize) {
    Site.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        neighbourhoodId: { type: DataTypes.INTEGER, allowNull: false },
        name: { type: DataTypes.TEXT, allowNull: false },
        latitude: { type: DataTypes.DOUBLE, allowNull: false },
        longitude: { type: DataTypes.DOUBLE, allowNull: false },
        groundElevationM: { type: DataTypes.DOUBLE, allowNull: false, defaultValue: 0 },
        antennaHeightM: { type: DataTypes.DOUBLE, allowNull: false, defaultValue: 0 },
        accessNotes: { type: DataTypes.TEXT },
        hostUserId: { type: DataTypes.INTEGER },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'sites' },
    );
  }
}
