import {
	DataTypes,
	Model,
	type CreationOptional,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';

export class Photo extends Model<InferAttributes<Photo>, InferCreationAttributes<Photo>> {
	declare id: CreationOptional<number>;
	declare organisationId: number;
	declare blockId: CreationOptional<number | null>;
	declare visitId: CreationOptional<number | null>;
	declare trapReadingId: CreationOptional<number | null>;
	declare uploadedBy: number;
	declare storageKey: string;
	declare thumbKey: string;
	declare mime: string;
	declare bytes: number;
	declare width: number;
	declare height: number;
	declare sha256: string;
	declare caption: CreationOptional<string | null>;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize) {
		Photo.init(
			{
				id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
				organisationId: { type: DataTypes.INTEGER, allowNull: false },
				blockId: { type: DataTypes.INTEGER, allowNull: true },
				visitId: { type: DataTypes.INTEGER, allowNull: true },
				trapReadingId: { type: DataTypes.INTEGER, allowNull: true },
				uploadedBy: { type: DataTypes.INTEGER, allowNull: false },
				storageKey: { type: DataTypes.STRING(200), allowNull: false },
				thumbKey: { type: DataTypes.STRING(200), allowNull: false },
				mime: { type: DataTypes.STRING(60), allowNull: false },
				bytes: { type: DataTypes.INTEGER, allowNull: false },
				width: { type: DataTypes.INTEGER, allowNull: false },
				height: { type: DataTypes.INTEGER, allowNull: false },
				sha256: { type: DataTypes.CHAR(64), allowNull: false },
				caption: { type: DataTypes.STRING(300), allowNull: true },
				createdAt: DataTypes.DATE,
				updatedAt: DataTypes.DATE
			},
			{ sequelize, tableName: 'photos', underscored: true, timestamps: true }
		);
	}
}
