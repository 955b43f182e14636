import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute, type Sequelize } from 'sequelize';
import type { User } from './user';

/** An announced time when a node is expected to be down: it shows as maintenance and nothing is mailed. */
export class MaintenanceWindow extends Model<InferAttributes<MaintenanceWindow>, InferCreationAttributes<MaintenanceWindow>> {
  declare id: CreationOptional<number>;
  declare nodeId: number;
  declare startsAt: Date;
  declare endsAt: Date;
  declare reason: CreationOptional<string | null>;
  declare createdBy: CreationOptional<number | null>;
  declare cancelledAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare creator?: NonAttribute<User | null>;

  static initModel(sequelize: Sequelize) {
    MaintenanceWindow.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        nodeId: { type: DataTypes.INTEGER, allowNull: false },
        startsAt: { type: DataTypes.DATE, allowNull: false },
        endsAt: { type: DataTypes.DATE, allowNull: false },
        reason: { type: DataTypes.TEXT },
        createdBy: { type: DataTypes.INTEGER },
        cancelledAt: { type: DataTypes.DATE },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'maintenance_windows' },
    );
  }
}
