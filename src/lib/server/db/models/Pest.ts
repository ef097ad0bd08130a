import {
	DataTypes,
	Model,
	type CreationOptional,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';
import type { PestParams } from '../../../engine';

export class Pest extends Model<InferAttributes<Pest>, InferCreationAttributes<Pest>> {
	declare id: CreationOptional<number>;
	declare code: string;
	declare name: string;
	declare scientificName: string;
	declare params: PestParams;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize) {
		Pest.init(
			{
				id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
				code: { type: DataTypes.STRING(40), allowNull: false },
				name: { type: DataTypes.STRING(120), allowNull: false },
				scientificName: { type: DataTypes.STRING(160), allowNull: false },
				params: { type: DataTypes.JSON, allowNull: false },
				createdAt: DataTypes.DATE,
				updatedAt: DataTypes.DATE
			},
			{ sequelize, tableName: 'pests', underscored: true, timestamps: true }
		);
	}
}
