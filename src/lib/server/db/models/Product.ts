import {
	DataTypes,
	Model,
	type CreationOptional,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';

export class Product extends Model<InferAttributes<Product>, InferCreationAttributes<Product>> {
	declare id: CreationOptional<number>;
	declare organisationId: number;
	declare name: string;
	declare activeIngredient: string;
	declare iracGroup: string;
	declare rate: number;
	declare rateUnit: string;
	declare reiHours: number;
	declare phiDays: number;
	declare beeHazard: 'low' | 'moderate' | 'high';
	declare notes: CreationOptional<string | null>;
	declare active: CreationOptional<boolean>;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize) {
		Product.init(
			{
				id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
				organisationId: { type: DataTypes.INTEGER, allowNull: false },
				name: { type: DataTypes.STRING(160), allowNull: false },
				activeIngredient: { type: DataTypes.STRING(200), allowNull: false },
				iracGroup: { type: DataTypes.STRING(8), allowNull: false },
				rate: { type: DataTypes.DOUBLE, allowNull: false },
				rateUnit: { type: DataTypes.STRING(40), allowNull: false },
				reiHours: { type: DataTypes.SMALLINT, allowNull: false },
				phiDays: { type: DataTypes.SMALLINT, allowNull: false },
				beeHazard: { type: DataTypes.ENUM('low', 'moderate', 'high'), allowNull: false },
				notes: { type: DataTypes.TEXT, allowNull: true },
				active: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
				createdAt: DataTypes.DATE,
				updatedAt: DataTypes.DATE
			},
			{ sequelize, tableName: 'products', underscored: true, timestamps: true }
		);
	}
}
