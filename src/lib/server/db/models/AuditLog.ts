import {
	DataTypes,
	Model,
	type CreationOptional,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';

export class AuditLog extends Model<InferAttributes<AuditLog>, InferCreationAttributes<AuditLog>> {
	declare id: CreationOptional<number>;
	declare organisationId: CreationOptional<number | null>;
	declare actorId: CreationOptional<number | null>;
	declare action: string;
	declare entity: string;
	declare entityId: CreationOptional<string | null>;
	declare details: CreationOptional<Record<string, unknown> | null>;
	declare createdAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize) {
		AuditLog.init(
			{
				id: { type: DataTypes.BIGINT, autoIncrement: true, primaryKey: true },
				organisationId: { type: DataTypes.INTEGER, allowNull: true },
				actorId: { type: DataTypes.INTEGER, allowNull: true },
				action: { type: DataTypes.STRING(60), allowNull: false },
				entity: { type: DataTypes.STRING(60), allowNull: false },
				entityId: { type: DataTypes.STRING(40), allowNull: true },
				details: { type: DataTypes.JSON, allowNull: true },
				createdAt: DataTypes.DATE(3)
			},
			{ sequelize, tableName: 'audit_log', underscored: true, timestamps: true, updatedAt: false }
		);
	}
}
