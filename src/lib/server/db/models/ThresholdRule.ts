import {
	DataTypes,
	Model,
	type CreationOptional,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';
import type { Provenance } from '../../../engine';
import { PROVENANCE } from '../../../domain';

export class ThresholdRule extends Model<
	InferAttributes<ThresholdRule>,
	InferCreationAttributes<ThresholdRule>
> {
	declare id: CreationOptional<number>;
	declare organisationId: CreationOptional<number | null>;
	declare cropId: number;
	declare pestId: number;
	declare sampleUnitId: number;
	declare bbchFrom: number;
	declare bbchTo: number;
	declare metric: 'mean' | 'proportion';
	declare tallyThreshold: CreationOptional<number | null>;
	declare action: number;
	declare injury: CreationOptional<number | null>;
	declare requiresRising: CreationOptional<boolean>;
	declare alsoProportion: CreationOptional<number | null>;
	declare label: string;
	declare source: string;
	declare provenance: Provenance;
	declare active: CreationOptional<boolean>;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize) {
		ThresholdRule.init(
			{
				id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
				organisationId: { type: DataTypes.INTEGER, allowNull: true },
				cropId: { type: DataTypes.INTEGER, allowNull: false },
				pestId: { type: DataTypes.INTEGER, allowNull: false },
				sampleUnitId: { type: DataTypes.INTEGER, allowNull: false },
				bbchFrom: { type: DataTypes.SMALLINT, allowNull: false },
				bbchTo: { type: DataTypes.SMALLINT, allowNull: false },
				metric: { type: DataTypes.ENUM('mean', 'proportion'), allowNull: false },
				tallyThreshold: { type: DataTypes.SMALLINT, allowNull: true },
				action: { type: DataTypes.DOUBLE, allowNull: false },
				injury: { type: DataTypes.DOUBLE, allowNull: true },
				requiresRising: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
				alsoProportion: { type: DataTypes.DOUBLE, allowNull: true },
				label: { type: DataTypes.STRING(200), allowNull: false },
				source: { type: DataTypes.STRING(500), allowNull: false },
				provenance: { type: DataTypes.ENUM(...PROVENANCE), allowNull: false },
				active: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
				createdAt: DataTypes.DATE,
				updatedAt: DataTypes.DATE
			},
			{ sequelize, tableName: 'threshold_rules', underscored: true, timestamps: true }
		);
	}
}
