import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

export class Photo extends Model<InferAttributes<Photo>, InferCreationAttributes<Photo>> {
  declare id: CreationOptional<number>;
  declare siteId: number;
  /** The random file name on disk; never derived from what the uploader sent. */
  declare storageKey: string;
  declare contentType: 'image/jpeg' | 'image/png' | 'image/webp';
  declare sizeBytes: number;
  declare widthPx: CreationOptional<number | null>;
  declare heightPx: CreationOptional<number | null>;
  declare hasThumbnail: CreationOptional<boolean>;
  declare caption: CreationOptional<string | null>;
  declare uploadedBy: CreationOptional<number | null>;
  declare createdAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    Photo.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        siteId: { type: DataTypes.INTEGER, allowNull: false },
        storageKey: { type: DataTypes.TEXT, allowNull: false },
        contentType: { type: DataTypes.TEXT, allowNull: false },
        sizeBytes: { type: DataTypes.INTEGER, allowNull: false },
        widthPx: { type: DataTypes.INTEGER },
        heightPx: { type: DataTypes.INTEGER },
        hasThumbnail: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
        caption: { type: DataTypes.TEXT },
        uploadedBy: { type: DataTypes.INTEGER },
        createdAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'photos', updatedAt: false },
    );
  }
}

let bound: Sequelize | null = null;
/** The photo model joins the others' instance; models/index.ts is shared, so it binds itself here. */
export function usePhotoModel(sequelize: Sequelize): void {
  if (bound === sequelize) return;
  Photo.initModel(sequelize);
  bound = sequelize;
}
