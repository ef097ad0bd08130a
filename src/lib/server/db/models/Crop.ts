import {
	DataTypes,
	Model,
	type CreationOptional,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';
import type { CropParams } from '../../../engine';

export class Crop extends Model<InferAttributes<Crop>, InferCreationAttributes<Crop>> {
	declare id: CreationOptional<number>;
	declare code: string;
	declare name: string;
	declare params: CropParams;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize) {
		Crop.init(
			{
				id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
				code: { type: DataTypes.STRING(40), allowNull: false },
				name: { type: DataTypes.STRING(120), allowNull: false },
				params: { type: DataTypes.JSON, allowNull: false },
				createdAt: DataTypes.DATE,
				updatedAt: DataTypes.DATE
			},
			{ sequelize, tableName: 'crops', underscored: true, timestamps: true }
		);
	}
}
