import {
	DataTypes,
	Model,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';

export class AuthVerificationToken extends Model<
	InferAttributes<AuthVerificationToken>,
	InferCreationAttributes<AuthVerificationToken>
> {
	declare identifier: string;
	declare token: string;
	declare expires: Date;

	static initModel(sequelize: Sequelize) {
		AuthVerificationToken.init(
			{
				identifier: { type: DataTypes.STRING(191), allowNull: false, primaryKey: true },
				token: { type: DataTypes.STRING(191), allowNull: false, primaryKey: true },
				expires: { type: DataTypes.DATE, allowNull: false }
			},
			{ sequelize, tableName: 'auth_verification_tokens', underscored: true, timestamps: false }
		);
	}
}
