import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import { MESSAGE_KINDS, type MessageKind } from '@shared/chat';

/** One chat message. `seq` orders a consultation's thread; (consultation, clientId) is unique. */
export class Message extends Model<InferAttributes<Message>, InferCreationAttributes<Message>> {
  declare id: CreationOptional<number>;
  declare consultationId: number;
  declare seq: number;
  declare clientId: string;
  declare senderId: number | null;
  declare kind: MessageKind;
  declare body: string;
  declare attachmentId: number | null;
  declare planId: number | null;
  declare createdAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): typeof Message {
    return Message.init(
      {
        id: { type: DataTypes.BIGINT.UNSIGNED, autoIncrement: true, primaryKey: true },
        consultationId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        seq: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        clientId: { type: DataTypes.CHAR(36), allowNull: false },
        senderId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
        kind: { type: DataTypes.ENUM(...MESSAGE_KINDS), allowNull: false },
        body: { type: DataTypes.TEXT, allowNull: false },
        attachmentId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
        planId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
        createdAt: DataTypes.DATE(3),
      },
      { sequelize, tableName: 'messages', updatedAt: false },
    );
  }
}
