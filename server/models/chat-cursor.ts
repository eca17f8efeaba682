import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/** How far a participant has received and read a thread; message states derive from it. */
export class ChatCursor extends Model<InferAttributes<ChatCursor>, InferCreationAttributes<ChatCursor>> {
  declare consultationId: number;
  declare userId: number;
  declare deliveredSeq: number;
  declare readSeq: number;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): typeof ChatCursor {
    return ChatCursor.init(
      {
        consultationId: { type: DataTypes.INTEGER.UNSIGNED, primaryKey: true },
        userId: { type: DataTypes.INTEGER.UNSIGNED, primaryKey: true },
        deliveredSeq: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
        readSeq: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'chat_cursors', createdAt: false },
    );
  }
}
