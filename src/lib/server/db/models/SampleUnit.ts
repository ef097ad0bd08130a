import {
	DataTypes,
	Model,
	type CreationOptional,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';

export class SampleUnit extends Model<
	InferAttributes<SampleUnit>,
	InferCreationAttributes<SampleUnit>
> {
	declare id: CreationOptional<number>;
	declare code: string;
	declare name: string;
	declare unitsPerPlantDefault: CreationOptional<number | null>;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize) {
		SampleUnit.init(
			{
				id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
				code: { type: DataTypes.STRING(40), allowNull: false },
				name: { type: DataTypes.STRING(120), allowNull: false },
				unitsPerPlantDefault: { type: DataTypes.DOUBLE, allowNull: true },
				createdAt: DataTypes.DATE,
				updatedAt: DataTypes.DATE
			},
			{ sequelize, tableName: 'sample_units', underscored: true, timestamps: true }
		);
	}
}
