import {
	DataTypes,
	Model,
	type CreationOptional,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';

export class TrapReading extends Model<
	InferAttributes<TrapReading>,
	InferCreationAttributes<TrapReading>
> {
	declare id: CreationOptional<number>;
	declare trapId: number;
	declare scoutId: number;
	declare clientKey: CreationOptional<string | null>;
	declare readOn: string;
	declare daysOut: number;
	declare alateCounts: Record<string, number>;
	declare alateTotal: number;
	declare cardChanged: CreationOptional<boolean>;
	declare notes: CreationOptional<string | null>;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize) {
		TrapReading.init(
			{
				id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
				trapId: { type: DataTypes.INTEGER, allowNull: false },
				scoutId: { type: DataTypes.INTEGER, allowNull: false },
				clientKey: { type: DataTypes.STRING(64), allowNull: true },
				readOn: { type: DataTypes.DATEONLY, allowNull: false },
				daysOut: { type: DataTypes.SMALLINT, allowNull: false },
				alateCounts: { type: DataTypes.JSON, allowNull: false },
				alateTotal: { type: DataTypes.INTEGER, allowNull: false },
				cardChanged: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
				notes: { type: DataTypes.TEXT, allowNull: true },
				createdAt: DataTypes.DATE,
				updatedAt: DataTypes.DATE
			},
			{ sequelize, tableName: 'trap_readings', underscored: true, timestamps: true }
		);
	}
}
