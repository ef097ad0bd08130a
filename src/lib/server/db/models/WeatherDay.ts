import {
	DataTypes,
	Model,
	type CreationOptional,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';

export class WeatherDay extends Model<
	InferAttributes<WeatherDay>,
	InferCreationAttributes<WeatherDay>
> {
	declare id: CreationOptional<number>;
	declare farmId: number;
	declare day: string;
	declare tminC: number;
	declare tmaxC: number;
	declare source: 'manual' | 'station-csv' | 'seed';
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize) {
		WeatherDay.init(
			{
				id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
				farmId: { type: DataTypes.INTEGER, allowNull: false },
				day: { type: DataTypes.DATEONLY, allowNull: false },
				tminC: { type: DataTypes.DOUBLE, allowNull: false, field: 'tmin_c' },
				tmaxC: { type: DataTypes.DOUBLE, allowNull: false, field: 'tmax_c' },
				source: { type: DataTypes.ENUM('manual', 'station-csv', 'seed'), allowNull: false },
				createdAt: DataTypes.DATE,
				updatedAt: DataTypes.DATE
			},
			{ sequelize, tableName: 'weather_days', underscored: true, timestamps: true }
		);
	}
}
