import {
	DataTypes,
	Model,
	type CreationOptional,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';
import type { LevelKey } from '../../../engine';
import { LEVEL_KEYS } from '../../../domain';
import type { GeoJSONPolygon } from '../../../geo/types';

export class Block extends Model<InferAttributes<Block>, InferCreationAttributes<Block>> {
	declare id: CreationOptional<number>;
	declare organisationId: number;
	declare farmId: number;
	declare cropId: number;
	declare pestId: number;
	declare name: string;
	declare variety: CreationOptional<string | null>;
	declare plantingDate: CreationOptional<string | null>;
	declare expectedHarvest: CreationOptional<string | null>;
	declare plantsPerHa: number;
	declare areaHa: number;
	declare boundary: CreationOptional<GeoJSONPolygon | null>;
	declare centroidLat: number;
	declare centroidLon: number;
	declare minLat: number;
	declare minLon: number;
	declare maxLat: number;
	declare maxLon: number;
	declare rescoutDays: CreationOptional<number>;
	declare expectedYieldKgHa: CreationOptional<number | null>;
	declare pricePerKg: CreationOptional<number | null>;
	declare currentLevel: CreationOptional<LevelKey | null>;
	declare currentReason: CreationOptional<string | null>;
	declare currentLevelAt: CreationOptional<Date | null>;
	declare lastVisitOn: CreationOptional<string | null>;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize) {
		Block.init(
			{
				id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
				organisationId: { type: DataTypes.INTEGER, allowNull: false },
				farmId: { type: DataTypes.INTEGER, allowNull: false },
				cropId: { type: DataTypes.INTEGER, allowNull: false },
				pestId: { type: DataTypes.INTEGER, allowNull: false },
				name: { type: DataTypes.STRING(160), allowNull: false },
				variety: { type: DataTypes.STRING(120), allowNull: true },
				plantingDate: { type: DataTypes.DATEONLY, allowNull: true },
				expectedHarvest: { type: DataTypes.DATEONLY, allowNull: true },
				plantsPerHa: { type: DataTypes.DOUBLE, allowNull: false },
				areaHa: { type: DataTypes.DOUBLE, allowNull: false },
				boundary: { type: DataTypes.JSON, allowNull: true },
				centroidLat: { type: DataTypes.DOUBLE, allowNull: false },
				centroidLon: { type: DataTypes.DOUBLE, allowNull: false },
				minLat: { type: DataTypes.DOUBLE, allowNull: false },
				minLon: { type: DataTypes.DOUBLE, allowNull: false },
				maxLat: { type: DataTypes.DOUBLE, allowNull: false },
				maxLon: { type: DataTypes.DOUBLE, allowNull: false },
				rescoutDays: { type: DataTypes.SMALLINT, allowNull: false, defaultValue: 7 },
				expectedYieldKgHa: { type: DataTypes.DOUBLE, allowNull: true },
				pricePerKg: { type: DataTypes.DOUBLE, allowNull: true },
				currentLevel: { type: DataTypes.ENUM(...LEVEL_KEYS), allowNull: true },
				currentReason: { type: DataTypes.STRING(300), allowNull: true },
				currentLevelAt: { type: DataTypes.DATE, allowNull: true },
				lastVisitOn: { type: DataTypes.DATEONLY, allowNull: true },
				createdAt: DataTypes.DATE,
				updatedAt: DataTypes.DATE
			},
			{ sequelize, tableName: 'blocks', underscored: true, timestamps: true }
		);
	}
}
