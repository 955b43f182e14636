import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { NodeState } from '../../shared/enums';

export class Node extends Model<InferAttributes<Node>, InferCreationAttributes<Node>> {
  declare id: CreationOptional<number>;
  declare siteId: number;
  declare neighbourhoodId: number;
  declare name: string;
  declare hardware: CreationOptional<string | null>;
  declare firmware: CreationOptional<string | null>;
  declare managementAddress: CreationOptional<string | null>;
  declare reportIntervalS: CreationOptional<number>;
  declare isUplink: CreationOptional<boolean>;
  declare state: CreationOptional<NodeState>;
  declare stateSince: CreationOptional<Date | null>;
  declare lastSeenAt: CreationOptional<Date | null>;
  declare firstSeenAt: CreationOptional<Date | null>;
  declare lastSeq: CreationOptional<string | null>;
  declare lastReport: CreationOptional<Record<string, unknown> | null>;
  declare healthStreak: CreationOptional<number>;
  declare healthReason: CreationOptional<string | null>;
  declare thresholds: CreationOptional<Record<string, number> | null>;
  declare drift: CreationOptional<{ field: string; expected: unknown; reported: unknown }[] | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    Node.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        siteId: { type: DataTypes.INTEGER, allowNull: false },
        neighbourhoodId: { type: DataTypes.INTEGER, allowNull: false },
        name: { type: DataTypes.TEXT, allowNull: false },
        hardware: { type: DataTypes.TEXT },
        firmware: { type: DataTypes.TEXT },
        managementAddress: { type: DataTypes.INET },
        reportIntervalS: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 60 },
        isUplink: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
        state: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'unknown' },
        stateSince: { type: DataTypes.DATE },
        lastSeenAt: { type: DataTypes.DATE },
        firstSeenAt: { type: DataTypes.DATE },
        lastSeq: { type: DataTypes.BIGINT },
        lastReport: { type: DataTypes.JSONB },
        healthStreak: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        healthReason: { type: DataTypes.TEXT },
        thresholds: { type: DataTypes.JSONB },
        drift: { type: DataTypes.JSONB },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'nodes' },
    );
  }
}
