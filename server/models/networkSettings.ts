import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/** The one row of network-wide settings (region, time zone, address pool). */
export class NetworkSettings extends Model<InferAttributes<NetworkSettings>, InferCreationAttributes<NetworkSettings>> {
  declare id: CreationOptional<number>;
  declare name: CreationOptional<string>;
  declare region: CreationOptional<'US' | 'EU' | 'JP'>;
  declare timeZone: CreationOptional<string>;
  declare addressPool: CreationOptional<string | null>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    NetworkSettings.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, defaultValue: 1 },
        name: { type: DataTypes.TEXT, allowNull: false },
        region: { type: DataTypes.TEXT, allowNull: false },
        timeZone: { type: DataTypes.TEXT, allowNull: false },
        addressPool: { type: DataTypes.CIDR },
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'network_settings', createdAt: false },
    );
  }
}
