import {
	DataTypes,
	Model,
	type CreationOptional,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';

export class VisitCount extends Model<
	InferAttributes<VisitCount>,
	InferCreationAttributes<VisitCount>
> {
	declare id: CreationOptional<number>;
	declare visitId: number;
	declare stopNo: number;
	declare unitNo: number;
	declare aphids: CreationOptional<number | null>;
	declare alate: CreationOptional<number | null>;
	declare infested: boolean;

	static initModel(sequelize: Sequelize) {
		VisitCount.init(
			{
				id: { type: DataTypes.BIGINT, autoIncrement: true, primaryKey: true },
				visitId: { type: DataTypes.INTEGER, allowNull: false },
				stopNo: { type: DataTypes.SMALLINT, allowNull: false },
				unitNo: { type: DataTypes.SMALLINT, allowNull: false },
				aphids: { type: DataTypes.INTEGER, allowNull: true },
				alate: { type: DataTypes.INTEGER, allowNull: true },
				infested: { type: DataTypes.BOOLEAN, allowNull: false }
			},
			{ sequelize, tableName: 'visit_counts', underscored: true, timestamps: false }
		);
	}
}
