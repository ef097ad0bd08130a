import {
	DataTypes,
	Model,
	type CreationOptional,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';
import {
	DECISIONS,
	RECOMMENDATION_STATUSES,
	type Decision,
	type RecommendationStatus,
	type RecommendationWarning
} from '../../../domain';

export class Recommendation extends Model<
	InferAttributes<Recommendation>,
	InferCreationAttributes<Recommendation>
> {
	declare id: CreationOptional<number>;
	declare organisationId: number;
	declare blockId: number;
	declare assessmentId: CreationOptional<number | null>;
	declare authorId: number;
	declare productId: CreationOptional<number | null>;
	declare acknowledgedBy: CreationOptional<number | null>;
	declare decision: Decision;
	declare targetDate: CreationOptional<string | null>;
	declare rescoutBy: CreationOptional<string | null>;
	declare notes: CreationOptional<string | null>;
	declare warnings: RecommendationWarning[];
	declare status: CreationOptional<RecommendationStatus>;
	declare issuedAt: CreationOptional<Date | null>;
	declare acknowledgedAt: CreationOptional<Date | null>;
	declare appliedOn: CreationOptional<string | null>;
	declare appliedBy: CreationOptional<string | null>;
	declare followUpDue: CreationOptional<string | null>;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize) {
		Recommendation.init(
			{
				id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
				organisationId: { type: DataTypes.INTEGER, allowNull: false },
				blockId: { type: DataTypes.INTEGER, allowNull: false },
				assessmentId: { type: DataTypes.INTEGER, allowNull: true },
				authorId: { type: DataTypes.INTEGER, allowNull: false },
				productId: { type: DataTypes.INTEGER, allowNull: true },
				acknowledgedBy: { type: DataTypes.INTEGER, allowNull: true },
				decision: { type: DataTypes.ENUM(...DECISIONS), allowNull: false },
				targetDate: { type: DataTypes.DATEONLY, allowNull: true },
				rescoutBy: { type: DataTypes.DATEONLY, allowNull: true },
				notes: { type: DataTypes.TEXT, allowNull: true },
				warnings: { type: DataTypes.JSON, allowNull: false },
				status: {
					type: DataTypes.ENUM(...RECOMMENDATION_STATUSES),
					allowNull: false,
					defaultValue: 'draft'
				},
				issuedAt: { type: DataTypes.DATE, allowNull: true },
				acknowledgedAt: { type: DataTypes.DATE, allowNull: true },
				appliedOn: { type: DataTypes.DATEONLY, allowNull: true },
				appliedBy: { type: DataTypes.STRING(160), allowNull: true },
				followUpDue: { type: DataTypes.DATEONLY, allowNull: true },
				createdAt: DataTypes.DATE,
				updatedAt: DataTypes.DATE
			},
			{ sequelize, tableName: 'recommendations', underscored: true, timestamps: true }
		);
	}
}
