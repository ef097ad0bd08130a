import {
	DataTypes,
	Model,
	type CreationOptional,
	type ForeignKey,
	type InferAttributes,
	type InferCreationAttributes,
	type NonAttribute,
	type Sequelize
} from 'sequelize';
import { ROLES, type Role } from '../../../roles';
import type { Organisation } from './Organisation';

export class Membership extends Model<
	InferAttributes<Membership>,
	InferCreationAttributes<Membership>
> {
	declare id: CreationOptional<number>;
	declare userId: ForeignKey<number>;
	declare organisationId: ForeignKey<number>;
	declare role: Role;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;
	declare organisation?: NonAttribute<Organisation>;

	static initModel(sequelize: Sequelize) {
		Membership.init(
			{
				id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
				role: { type: DataTypes.ENUM(...ROLES), allowNull: false },
				createdAt: DataTypes.DATE,
				updatedAt: DataTypes.DATE
			},
			{ sequelize, tableName: 'memberships', underscored: true }
		);
	}
}
