import {
	DataTypes,
	Model,
	type CreationOptional,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';
import type { LevelKey } from '../../../engine';
import { LEVEL_KEYS, type Channel } from '../../../domain';

export class Subscription extends Model<
	InferAttributes<Subscription>,
	InferCreationAttributes<Subscription>
> {
	declare id: CreationOptional<number>;
	declare userId: number;
	declare farmId: CreationOptional<number | null>;
	declare blockId: CreationOptional<number | null>;
	declare channel: Channel;
	declare minLevel: CreationOptional<LevelKey>;
	declare quietStart: CreationOptional<string | null>;
	declare quietEnd: CreationOptional<string | null>;
	declare active: CreationOptional<boolean>;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize) {
		Subscription.init(
			{
				id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
				userId: { type: DataTypes.INTEGER, allowNull: false },
				farmId: { type: DataTypes.INTEGER, allowNull: true },
				blockId: { type: DataTypes.INTEGER, allowNull: true },
				channel: { type: DataTypes.ENUM('sms', 'email'), allowNull: false },
				minLevel: { type: DataTypes.ENUM(...LEVEL_KEYS), allowNull: false, defaultValue: 'action' },
				quietStart: { type: DataTypes.STRING(5), allowNull: true },
				quietEnd: { type: DataTypes.STRING(5), allowNull: true },
				active: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
				createdAt: DataTypes.DATE,
				updatedAt: DataTypes.DATE
			},
			{ sequelize, tableName: 'subscriptions', underscored: true, timestamps: true }
		);
	}
}
