import {
	DataTypes,
	Model,
	type CreationOptional,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';
import { NOTIFICATION_STATUSES, type Channel, type NotificationStatus } from '../../../domain';

export class Notification extends Model<
	InferAttributes<Notification>,
	InferCreationAttributes<Notification>
> {
	declare id: CreationOptional<number>;
	declare organisationId: number;
	declare userId: CreationOptional<number | null>;
	declare blockId: CreationOptional<number | null>;
	declare recommendationId: CreationOptional<number | null>;
	declare channel: Channel;
	declare kind: string;
	declare dedupeKey: string;
	declare toAddress: string;
	declare subject: CreationOptional<string | null>;
	declare bodyText: string;
	declare bodyHtml: CreationOptional<string | null>;
	declare status: CreationOptional<NotificationStatus>;
	declare attempts: CreationOptional<number>;
	declare notBefore: Date;
	declare claimedBy: CreationOptional<string | null>;
	declare claimedAt: CreationOptional<Date | null>;
	declare providerId: CreationOptional<string | null>;
	declare lastError: CreationOptional<string | null>;
	declare sentAt: CreationOptional<Date | null>;
	declare deliveredAt: CreationOptional<Date | null>;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize) {
		Notification.init(
			{
				id: { type: DataTypes.BIGINT, autoIncrement: true, primaryKey: true },
				organisationId: { type: DataTypes.INTEGER, allowNull: false },
				userId: { type: DataTypes.INTEGER, allowNull: true },
				blockId: { type: DataTypes.INTEGER, allowNull: true },
				recommendationId: { type: DataTypes.INTEGER, allowNull: true },
				channel: { type: DataTypes.ENUM('sms', 'email'), allowNull: false },
				kind: { type: DataTypes.STRING(40), allowNull: false },
				dedupeKey: { type: DataTypes.STRING(191), allowNull: false },
				toAddress: { type: DataTypes.STRING(254), allowNull: false },
				subject: { type: DataTypes.STRING(300), allowNull: true },
				bodyText: { type: DataTypes.TEXT, allowNull: false },
				bodyHtml: { type: DataTypes.TEXT, allowNull: true },
				status: {
					type: DataTypes.ENUM(...NOTIFICATION_STATUSES),
					allowNull: false,
					defaultValue: 'pending'
				},
				attempts: { type: DataTypes.SMALLINT, allowNull: false, defaultValue: 0 },
				notBefore: { type: DataTypes.DATE(3), allowNull: false },
				claimedBy: { type: DataTypes.STRING(80), allowNull: true },
				claimedAt: { type: DataTypes.DATE(3), allowNull: true },
				providerId: { type: DataTypes.STRING(80), allowNull: true },
				lastError: { type: DataTypes.STRING(500), allowNull: true },
				sentAt: { type: DataTypes.DATE(3), allowNull: true },
				deliveredAt: { type: DataTypes.DATE(3), allowNull: true },
				createdAt: DataTypes.DATE,
				updatedAt: DataTypes.DATE
			},
			{ sequelize, tableName: 'notifications', underscored: true, timestamps: true }
		);
	}
}
