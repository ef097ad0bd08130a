import {
	DataTypes,
	Model,
	type CreationOptional,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';

export class AuthAccount extends Model<
	InferAttributes<AuthAccount>,
	InferCreationAttributes<AuthAccount>
> {
	declare id: CreationOptional<number>;
	declare userId: number;
	declare type: string;
	declare provider: string;
	declare providerAccountId: string;
	declare refresh_token: string | null;
	declare access_token: string | null;
	declare expires_at: number | null;
	declare token_type: string | null;
	declare scope: string | null;
	declare id_token: string | null;
	declare session_state: string | null;

	static initModel(sequelize: Sequelize) {
		AuthAccount.init(
			{
				id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
				userId: { type: DataTypes.INTEGER, allowNull: false },
				type: { type: DataTypes.STRING(40), allowNull: false },
				provider: { type: DataTypes.STRING(80), allowNull: false },
				providerAccountId: { type: DataTypes.STRING(191), allowNull: false },
				refresh_token: { type: DataTypes.TEXT, allowNull: true, field: 'refresh_token' },
				access_token: { type: DataTypes.TEXT, allowNull: true, field: 'access_token' },
				expires_at: { type: DataTypes.INTEGER, allowNull: true, field: 'expires_at' },
				token_type: { type: DataTypes.STRING(40), allowNull: true, field: 'token_type' },
				scope: { type: DataTypes.STRING(255), allowNull: true },
				id_token: { type: DataTypes.TEXT, allowNull: true, field: 'id_token' },
				session_state: { type: DataTypes.STRING(255), allowNull: true, field: 'session_state' }
			},
			{ sequelize, tableName: 'auth_accounts', underscored: true, timestamps: false }
		);
	}
}
