import {
	DataTypes,
	Model,
	type CreationOptional,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';

export class Farm extends Model<InferAttributes<Farm>, InferCreationAttributes<Farm>> {
	declare id: CreationOptional<number>;
	declare organisationId: number;
	declare growerId: number;
	declare name: string;
	declare locality: CreationOptional<string | null>;
	declare lat: number;
	declare lon: number;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize) {
		Farm.init(
			{
				id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
				organisationId: { type: DataTypes.INTEGER, allowNull: false },
				growerId: { type: DataTypes.INTEGER, allowNull: false },
				name: { type: DataTypes.STRING(160), allowNull: false },
				locality: { type: DataTypes.STRING(160), allowNull: true },
				lat: { type: DataTypes.DOUBLE, allowNull: false },
				lon: { type: DataTypes.DOUBLE, allowNull: false },
				createdAt: DataTypes.DATE,
				updatedAt: DataTypes.DATE
			},
			{ sequelize, tableName: 'farms', underscored: true, timestamps: true }
		);
	}
}
