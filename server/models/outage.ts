import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute, type Sequelize } from 'sequelize';
import type { Node } from './node';
import type { User } from './user';

export class Outage extends Model<InferAttributes<Outage>, InferCreationAttributes<Outage>> {
  declare id: CreationOptional<number>;
  declare nodeId: number;
  declare startedAt: Date;
  declare endedAt: CreationOptional<Date | null>;
  declare acknowledgedAt: CreationOptional<Date | null>;
  declare acknowledgedBy: CreationOptional<number | null>;
  declare notes: CreationOptional<string | null>;
  /** Nodes cut off behind this outage and the clients they served at their last report (the blast radius). */
  declare blastNodeCount: CreationOptional<number>;
  declare blastClients: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare node?: NonAttribute<Node>;
  declare acknowledger?: NonAttribute<User | null>;

  static initModel(sequelize: Sequelize) {
    Outage.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        nodeId: { type: DataTypes.INTEGER, allowNull: false },
        startedAt: { type: DataTypes.DATE, allowNull: false },
        endedAt: { type: DataTypes.DATE },
        acknowledgedAt: { type: DataTypes.DATE },
        acknowledgedBy: { type: DataTypes.INTEGER },
        notes: { type: DataTypes.TEXT },
        blastNodeCount: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        blastClients: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'outages' },
    );
  }
}
