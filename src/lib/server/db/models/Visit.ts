import {
	DataTypes,
	Model,
	type CreationOptional,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';

export class Visit extends Model<InferAttributes<Visit>, InferCreationAttributes<Visit>> {
	declare id: CreationOptional<number>;
	declare blockId: number;
	declare scoutId: number;
	declare pestId: number;
	declare sampleUnitId: number;
	declare clientKey: CreationOptional<string | null>;
	declare visitedOn: string;
	declare startedAt: CreationOptional<Date | null>;
	declare lat: CreationOptional<number | null>;
	declare lon: CreationOptional<number | null>;
	declare positionSource: 'gps' | 'manual' | 'none';
	declare outsideBoundary: CreationOptional<boolean>;
	declare bbch: CreationOptional<number | null>;
	declare airTempC: CreationOptional<number | null>;
	declare mode: 'count' | 'presence';
	declare tallyThreshold: CreationOptional<number | null>;
	declare mummies: CreationOptional<number>;
	declare ladybeetles: CreationOptional<number>;
	declare lacewings: CreationOptional<number>;
	declare hoverflies: CreationOptional<number>;
	declare otherPredators: CreationOptional<number>;
	declare notes: CreationOptional<string | null>;
	declare entryChannel: CreationOptional<'phone' | 'api' | 'csv'>;
	declare samplingPlan: CreationOptional<string | null>;
	declare planDecision: CreationOptional<string | null>;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize) {
		Visit.init(
			{
				id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
				blockId: { type: DataTypes.INTEGER, allowNull: false },
				scoutId: { type: DataTypes.INTEGER, allowNull: false },
				pestId: { type: DataTypes.INTEGER, allowNull: false },
				sampleUnitId: { type: DataTypes.INTEGER, allowNull: false },
				clientKey: { type: DataTypes.STRING(64), allowNull: true },
				visitedOn: { type: DataTypes.DATEONLY, allowNull: false },
				startedAt: { type: DataTypes.DATE, allowNull: true },
				lat: { type: DataTypes.DOUBLE, allowNull: true },
				lon: { type: DataTypes.DOUBLE, allowNull: true },
				positionSource: { type: DataTypes.ENUM('gps', 'manual', 'none'), allowNull: false },
				outsideBoundary: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
				bbch: { type: DataTypes.SMALLINT, allowNull: true },
				airTempC: { type: DataTypes.DOUBLE, allowNull: true, field: 'air_temp_c' },
				mode: { type: DataTypes.ENUM('count', 'presence'), allowNull: false },
				tallyThreshold: { type: DataTypes.SMALLINT, allowNull: true },
				mummies: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
				ladybeetles: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
				lacewings: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
				hoverflies: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
				otherPredators: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
				notes: { type: DataTypes.TEXT, allowNull: true },
				entryChannel: {
					type: DataTypes.ENUM('phone', 'api', 'csv'),
					allowNull: false,
					defaultValue: 'api'
				},
				samplingPlan: { type: DataTypes.STRING(40), allowNull: true },
				planDecision: { type: DataTypes.STRING(200), allowNull: true },
				createdAt: DataTypes.DATE,
				updatedAt: DataTypes.DATE
			},
			{ sequelize, tableName: 'visits', underscored: true, timestamps: true }
		);
	}
}
