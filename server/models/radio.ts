import { DataTypes, Model, type NonAttribute, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { Band, Encryption, RadioRole } from '../../shared/enums';
import type { Node } from './node';

export class Radio extends Model<InferAttributes<Radio>, InferCreationAttributes<Radio>> {
  declare id: CreationOptional<number>;
  declare nodeId: number;
  declare iface: string;
  declare band: Band;
  declare channel: number;
  declare channelWidthMHz: number;
  declare txPowerDbm: number;
  declare antennaGainDbi: number;
  declare polarisation: CreationOptional<string>;
  declare cableLossDb: CreationOptional<number>;
  declare role: RadioRole;
  declare ssid: CreationOptional<string | null>;
  declare encryption: Encryption;
  declare preSharedKey: CreationOptional<string | null>;
  declare groupRekeyS: CreationOptional<number>;
  /** The radio's own MAC as its node last reported it; learned from reports, never typed in. */
  declare mac: CreationOptional<string | null>;
  declare macReportedAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare node?: NonAttribute<Node>;

  static initModel(sequelize: Sequelize) {
    Radio.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        nodeId: { type: DataTypes.INTEGER, allowNull: false },
        iface: { type: DataTypes.TEXT, allowNull: false },
        band: { type: DataTypes.TEXT, allowNull: false },
        channel: { type: DataTypes.INTEGER, allowNull: false },
        channelWidthMHz: { type: DataTypes.INTEGER, allowNull: false, field: 'channel_width_mhz' },
        txPowerDbm: { type: DataTypes.DOUBLE, allowNull: false },
        antennaGainDbi: { type: DataTypes.DOUBLE, allowNull: false },
        polarisation: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'vertical' },
        cableLossDb: { type: DataTypes.DOUBLE, allowNull: false, defaultValue: 0 },
        role: { type: DataTypes.TEXT, allowNull: false },
        ssid: { type: DataTypes.TEXT },
        encryption: { type: DataTypes.TEXT, allowNull: false },
        preSharedKey: { type: DataTypes.TEXT },
        groupRekeyS: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 600 },
        mac: { type: DataTypes.TEXT },
        macReportedAt: { type: DataTypes.DATE, field: 'mac_reported_at' },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'radios' },
    );
  }
}
