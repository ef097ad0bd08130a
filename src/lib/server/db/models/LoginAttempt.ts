import {
	DataTypes,
	Model,
	type CreationOptional,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';

export class LoginAttempt extends Model<
	InferAttributes<LoginAttempt>,
	InferCreationAttributes<LoginAttempt>
> {
	declare id: CreationOptional<number>;
	declare email: string;
	declare ip: string;
	declare succeeded: boolean;
	declare createdAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize) {
		LoginAttempt.init(
			{
				id: { type: DataTypes.BIGINT, autoIncrement: true, primaryKey: true },
				email: { type: DataTypes.STRING(254), allowNull: false },
				ip: { type: DataTypes.STRING(64), allowNull: false },
				succeeded: { type: DataTypes.BOOLEAN, allowNull: false },
				createdAt: DataTypes.DATE(3)
			},
			{
				sequelize,
				tableName: 'login_attempts',
				underscored: true,
				timestamps: true,
				updatedAt: false
			}
		);
	}
}
