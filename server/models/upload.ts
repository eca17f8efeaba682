import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { UploadContentType, UploadView } from '@shared/rider';

/** A stored photo or clip of the rider; the file is under UPLOAD_DIR as `storageName`. */
export class Upload extends Model<InferAttributes<Upload>, InferCreationAttributes<Upload>> {
  declare id: CreationOptional<number>;
  declare riderId: number;
  declare intakeId: number;
  declare view: UploadView;
  declare kind: 'photo' | 'clip';
  declare contentType: UploadContentType;
  declare byteSize: number;
  declare width: number | null;
  declare height: number | null;
  declare storageName: string;
  declare thumbnailName: string | null;
  declare metadataStripped: boolean;
  declare createdAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): typeof Upload {
    return Upload.init(
      {
        id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
        riderId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        intakeId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        view: { type: DataTypes.STRING(24), allowNull: false },
        kind: { type: DataTypes.ENUM('photo', 'clip'), allowNull: false },
        contentType: { type: DataTypes.STRING(40), allowNull: false },
        byteSize: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        width: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
        height: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
        storageName: { type: DataTypes.STRING(80), allowNull: false },
        thumbnailName: { type: DataTypes.STRING(80), allowNull: true },
        metadataStripped: { type: DataTypes.BOOLEAN, allowNull: false },
        createdAt: DataTypes.DATE(3),
      },
      { sequelize, tableName: 'uploads', updatedAt: false },
    );
  }
}
