import { DataTypes, Model, type NonAttribute, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { LinkStatus } from '../../shared/enums';
import type { Radio } from './radio';

export class Link extends Model<InferAttributes<Link>, InferCreationAttributes<Link>> {
  declare id: CreationOptional<number>;
  declare name: CreationOptional<string | null>;
  declare radioAId: number;
  declare radioBId: number;
  declare status: CreationOptional<LinkStatus>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare radioA?: NonAttribute<Radio>;
  declare radioB?: NonAttribute<Radio>;

  static initModel(sequelize: Sequelize) {
    Link.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        name: { type: DataTypes.TEXT },
        radioAId: { type: DataTypes.INTEGER, allowNull: false },
        radioBId: { type: DataTypes.INTEGER, allowNull: false },
        status: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'planned' },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'links' },
    );
  }
}
