import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

export type OutboxStatus = 'pending' | 'sent' | 'failed';

/** One outgoing mail, written in the transaction that decided it and delivered later by the sender job. */
export class OutboxMessage extends Model<InferAttributes<OutboxMessage>, InferCreationAttributes<OutboxMessage>> {
  declare id: CreationOptional<number>;
  declare kind: string;
  declare recipientUserId: number | null;
  declare recipientAddress: string;
  declare recipientName: string | null;
  declare subject: string;
  declare textBody: string;
  declare htmlBody: string;
  declare unsubscribeUrl: string | null;
  declare nodeId: number | null;
  declare outageId: number | null;
  declare dedupeKey: string;
  declare status: CreationOptional<OutboxStatus>;
  declare attempts: CreationOptional<number>;
  declare nextAttemptAt: Date;
  declare lastError: CreationOptional<string | null>;
  declare createdAt: Date;
  declare sentAt: CreationOptional<Date | null>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    OutboxMessage.init(
      {
        id: {
          type: DataTypes.BIGINT,
          primaryKey: true,
          autoIncrement: true,
          get(this: OutboxMessage) {
            return Number(this.getDataValue('id'));
          },
        },
        kind: { type: DataTypes.TEXT, allowNull: false },
        recipientUserId: { type: DataTypes.INTEGER },
        recipientAddress: { type: DataTypes.TEXT, allowNull: false },
        recipientName: { type: DataTypes.TEXT },
        subject: { type: DataTypes.TEXT, allowNull: false },
        textBody: { type: DataTypes.TEXT, allowNull: false },
        htmlBody: { type: DataTypes.TEXT, allowNull: false },
        unsubscribeUrl: { type: DataTypes.TEXT },
        nodeId: { type: DataTypes.INTEGER },
        outageId: { type: DataTypes.INTEGER },
        dedupeKey: { type: DataTypes.TEXT, allowNull: false },
        status: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'pending' },
        attempts: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        nextAttemptAt: { type: DataTypes.DATE, allowNull: false },
        lastError: { type: DataTypes.TEXT },
        createdAt: { type: DataTypes.DATE, allowNull: false },
        sentAt: { type: DataTypes.DATE },
        updatedAt: DataTypes.DATE,
      },
      // created_at comes from the app's clock (the flap cap counts by it), so Sequelize must not set it.
      { sequelize, tableName: 'outbox', createdAt: false },
    );
  }
}
