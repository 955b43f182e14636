import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

export type OperatorMailMode = 'immediate' | 'hourly' | 'off';

/** A person's mail choices; no row means the defaults of the migration. Quiet hours are "HH:MM" in the network's time zone. */
export class AlertPreference extends Model<InferAttributes<AlertPreference>, InferCreationAttributes<AlertPreference>> {
  declare userId: number;
  declare operatorMode: CreationOptional<OperatorMailMode>;
  declare hostMail: CreationOptional<boolean>;
  declare quietStart: CreationOptional<string | null>;
  declare quietEnd: CreationOptional<string | null>;
  declare adminNodeMail: CreationOptional<boolean>;
  declare adminSelfCheck: CreationOptional<boolean>;
  declare upstreamNotices: CreationOptional<boolean>;
  declare degradedDigest: CreationOptional<boolean>;
  declare unsubscribedAt: CreationOptional<Date | null>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    AlertPreference.init(
      {
        userId: { type: DataTypes.INTEGER, primaryKey: true },
        operatorMode: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'immediate' },
        hostMail: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
        quietStart: { type: DataTypes.TIME },
        quietEnd: { type: DataTypes.TIME },
        adminNodeMail: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
        adminSelfCheck: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
        upstreamNotices: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
        degradedDigest: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
        unsubscribedAt: { type: DataTypes.DATE },
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'alert_preferences', createdAt: false },
    );
  }
}
