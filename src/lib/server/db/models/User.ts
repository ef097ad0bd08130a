import {
	DataTypes,
	Model,
	type CreationOptional,
	type InferAttributes,
	type InferCreationAttributes,
	type NonAttribute,
	type Sequelize
} from 'sequelize';
import type { Membership } from './Membership';

export class User extends Model<InferAttributes<User>, InferCreationAttributes<User>> {
	declare id: CreationOptional<number>;
	declare name: string;
	declare email: string;
	declare emailVerified: CreationOptional<Date | null>;
	declare passwordHash: CreationOptional<string | null>;
	declare phoneE164: CreationOptional<string | null>;
	declare image: CreationOptional<string | null>;
	declare unitSystem: CreationOptional<'metric' | 'imperial'>;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;
	declare memberships?: NonAttribute<Membership[]>;

	static initModel(sequelize: Sequelize) {
		User.init(
			{
				id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
				name: { type: DataTypes.STRING(160), allowNull: false },
				email: { type: DataTypes.STRING(254), allowNull: false },
				emailVerified: { type: DataTypes.DATE, allowNull: true },
				passwordHash: { type: DataTypes.STRING(255), allowNull: true },
				phoneE164: { type: DataTypes.STRING(20), allowNull: true, field: 'phone_e164' },
				image: { type: DataTypes.STRING(500), allowNull: true },
				unitSystem: {
					type: DataTypes.ENUM('metric', 'imperial'),
					allowNull: false,
					defaultValue: 'metric'
				},
				createdAt: DataTypes.DATE,
				updatedAt: DataTypes.DATE
			},
			{ sequelize, tableName: 'users', underscored: true }
		);
	}
}
