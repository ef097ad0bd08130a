import {
	DataTypes,
	Model,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';

export class SmsOptOut extends Model<
	InferAttributes<SmsOptOut>,
	InferCreationAttributes<SmsOptOut>
> {
	declare phoneE164: string;
	declare optedOutAt: Date;

	static initModel(sequelize: Sequelize) {
		SmsOptOut.init(
			{
				phoneE164: {
					type: DataTypes.STRING(20),
					allowNull: false,
					primaryKey: true,
					field: 'phone_e164'
				},
				optedOutAt: { type: DataTypes.DATE, allowNull: false }
			},
			{ sequelize, tableName: 'sms_opt_outs', underscored: true, timestamps: false }
		);
	}
}
