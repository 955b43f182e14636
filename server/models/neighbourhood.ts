import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

export class Neighbourhood extends Model<InferAttributes<Neighbourhood>, InferCreationAttributes<Neighbourhood>> {
  declare id: CreationOptional<number>;
  declare name: string;
  declare description: CreationOptional<string | null>;
  declare retiredAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    Neighbourhood.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        name: { type: DataTypes.TEXT, allowNull: false },
        description: { type: DataTypes.TEXT },
        retiredAt: { type: DataTypes.DATE },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'neighbourhoods' },
    );
  }
}

export class OperatorAssignment extends Model<InferAttributes<OperatorAssignment>, InferCreationAttributes<OperatorAssignment>> {
  declare userId: number;
  declare neighbourhoodId: number;
  declare createdAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    OperatorAssignment.init(
      {
        userId: { type: DataTypes.INTEGER, primaryKey: true },
        neighbourhoodId: { type: DataTypes.INTEGER, primaryKey: true },
        createdAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'operator_assignments', updatedAt: false },
    );
  }
}
