import {
	DataTypes,
	Model,
	type CreationOptional,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';

export class Organisation extends Model<
	InferAttributes<Organisation>,
	InferCreationAttributes<Organisation>
> {
	declare id: CreationOptional<number>;
	declare name: string;
	declare slug: string;
	declare kind: 'advisory' | 'coop' | 'extension';
	declare region: string;
	declare timezone: CreationOptional<string>;
	/** ISO 3166-1 alpha-2; the default for phone numbers typed without a country code. */
	declare country: CreationOptional<string>;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize) {
		Organisation.init(
			{
				id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
				name: { type: DataTypes.STRING(160), allowNull: false },
				slug: { type: DataTypes.STRING(80), allowNull: false },
				kind: { type: DataTypes.ENUM('advisory', 'coop', 'extension'), allowNull: false },
				region: { type: DataTypes.STRING(160), allowNull: false },
				timezone: { type: DataTypes.STRING(64), allowNull: false, defaultValue: 'UTC' },
				country: { type: DataTypes.CHAR(2), allowNull: false, defaultValue: 'US' },
				createdAt: DataTypes.DATE,
				updatedAt: DataTypes.DATE
			},
			{ sequelize, tableName: 'organisations', underscored: true }
		);
	}
}
