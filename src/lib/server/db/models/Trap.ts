import {
	DataTypes,
	Model,
	type CreationOptional,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';
import type { TrapKind } from '../../../domain';

export class Trap extends Model<InferAttributes<Trap>, InferCreationAttributes<Trap>> {
	declare id: CreationOptional<number>;
	declare organisationId: number;
	declare farmId: number;
	declare name: string;
	declare kind: TrapKind;
	declare lat: number;
	declare lon: number;
	declare active: CreationOptional<boolean>;
	declare installedOn: CreationOptional<string | null>;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize) {
		Trap.init(
			{
				id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
				organisationId: { type: DataTypes.INTEGER, allowNull: false },
				farmId: { type: DataTypes.INTEGER, allowNull: false },
				name: { type: DataTypes.STRING(120), allowNull: false },
				kind: { type: DataTypes.ENUM('yellow-sticky', 'water-pan', 'suction'), allowNull: false },
				lat: { type: DataTypes.DOUBLE, allowNull: false },
				lon: { type: DataTypes.DOUBLE, allowNull: false },
				active: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
				installedOn: { type: DataTypes.DATEONLY, allowNull: true },
				createdAt: DataTypes.DATE,
				updatedAt: DataTypes.DATE
			},
			{ sequelize, tableName: 'traps', underscored: true, timestamps: true }
		);
	}
}
