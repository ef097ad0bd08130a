import {
	DataTypes,
	Model,
	type CreationOptional,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';

export class ScoutingAssignment extends Model<
	InferAttributes<ScoutingAssignment>,
	InferCreationAttributes<ScoutingAssignment>
> {
	declare id: CreationOptional<number>;
	declare blockId: number;
	declare scoutId: number;
	declare assignedBy: CreationOptional<number | null>;
	declare intervalDays: CreationOptional<number>;
	declare active: CreationOptional<boolean>;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize) {
		ScoutingAssignment.init(
			{
				id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
				blockId: { type: DataTypes.INTEGER, allowNull: false },
				scoutId: { type: DataTypes.INTEGER, allowNull: false },
				assignedBy: { type: DataTypes.INTEGER, allowNull: true },
				intervalDays: { type: DataTypes.SMALLINT, allowNull: false, defaultValue: 7 },
				active: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
				createdAt: DataTypes.DATE,
				updatedAt: DataTypes.DATE
			},
			{ sequelize, tableName: 'scouting_assignments', underscored: true, timestamps: true }
		);
	}
}
