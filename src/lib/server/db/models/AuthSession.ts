import {
	DataTypes,
	Model,
	type CreationOptional,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';

export class AuthSession extends Model<
	InferAttributes<AuthSession>,
	InferCreationAttributes<AuthSession>
> {
	declare id: CreationOptional<number>;
	declare userId: number;
	declare sessionToken: string;
	declare expires: Date;

	static initModel(sequelize: Sequelize) {
		AuthSession.init(
			{
				id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
				userId: { type: DataTypes.INTEGER, allowNull: false },
				sessionToken: { type: DataTypes.STRING(191), allowNull: false },
				expires: { type: DataTypes.DATE, allowNull: false }
			},
			{ sequelize, tableName: 'auth_sessions', underscored: true, timestamps: false }
		);
	}
}
