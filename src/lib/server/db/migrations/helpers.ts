import { DataTypes, type ModelAttributeColumnOptions } from 'sequelize';

export const timestamps = {
	created_at: { type: DataTypes.DATE, allowNull: false },
	updated_at: { type: DataTypes.DATE, allowNull: false }
};

/** A foreign key column; `null` in `onDelete` keeps the referencing row. */
export function fk(
	table: string,
	opts: { allowNull?: boolean; onDelete?: 'CASCADE' | 'SET NULL' | 'RESTRICT' } = {}
): ModelAttributeColumnOptions {
	const allowNull = opts.allowNull ?? false;
	return {
		type: DataTypes.INTEGER,
		allowNull,
		references: { model: table, key: 'id' },
		onDelete: opts.onDelete ?? (allowNull ? 'SET NULL' : 'CASCADE')
	};
}

export const id = { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true };
