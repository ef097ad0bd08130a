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

export class Assessment extends Model<
	InferAttributes<Assessment>,
	InferCreationAttributes<Assessment>
> {
	declare id: CreationOptional<number>;
	declare blockId: number;
	declare visitId: CreationOptional<number | null>;
	declare computedAt: Date;
	declare level: LevelKey;
	declare reason: string;
	declare inputs: object;
	declare result: object;

	static initModel(sequelize: Sequelize) {
		Assessment.init(
			{
				id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
				blockId: { type: DataTypes.INTEGER, allowNull: false },
				visitId: { type: DataTypes.INTEGER, allowNull: true },
				computedAt: { type: DataTypes.DATE(3), allowNull: false },
				level: { type: DataTypes.ENUM(...LEVEL_KEYS), allowNull: false },
				reason: { type: DataTypes.STRING(300), allowNull: false },
				inputs: { type: DataTypes.JSON, allowNull: false },
				result: { type: DataTypes.JSON, allowNull: false }
			},
			{ sequelize, tableName: 'assessments', underscored: true, timestamps: false }
		);
	}
}
