import type { Sequelize } from 'sequelize';
import { Assessment } from './Assessment';
import { AuditLog } from './AuditLog';
import { AuthAccount } from './AuthAccount';
import { AuthSession } from './AuthSession';
import { AuthVerificationToken } from './AuthVerificationToken';
import { Block } from './Block';
import { Crop } from './Crop';
import { Farm } from './Farm';
import { LoginAttempt } from './LoginAttempt';
import { Membership } from './Membership';
import { Notification } from './Notification';
import { Organisation } from './Organisation';
import { Pest } from './Pest';
import { Photo } from './Photo';
import { Product } from './Product';
import { Recommendation } from './Recommendation';
import { SampleUnit } from './SampleUnit';
import { ScoutingAssignment } from './ScoutingAssignment';
import { SmsOptOut } from './SmsOptOut';
import { Subscription } from './Subscription';
import { ThresholdRule } from './ThresholdRule';
import { Trap } from './Trap';
import { TrapReading } from './TrapReading';
import { User } from './User';
import { Visit } from './Visit';
import { VisitCount } from './VisitCount';
import { WeatherDay } from './WeatherDay';

export {
	Assessment,
	AuditLog,
	AuthAccount,
	AuthSession,
	AuthVerificationToken,
	Block,
	Crop,
	Farm,
	LoginAttempt,
	Membership,
	Notification,
	Organisation,
	Pest,
	Photo,
	Product,
	Recommendation,
	SampleUnit,
	ScoutingAssignment,
	SmsOptOut,
	Subscription,
	ThresholdRule,
	Trap,
	TrapReading,
	User,
	Visit,
	VisitCount,
	WeatherDay
};

const ALL = [
	Assessment,
	AuditLog,
	AuthAccount,
	AuthSession,
	AuthVerificationToken,
	Block,
	Crop,
	Farm,
	LoginAttempt,
	Membership,
	Notification,
	Organisation,
	Pest,
	Photo,
	Product,
	Recommendation,
	SampleUnit,
	ScoutingAssignment,
	SmsOptOut,
	Subscription,
	ThresholdRule,
	Trap,
	TrapReading,
	User,
	Visit,
	VisitCount,
	WeatherDay
];

let initialised: Sequelize | null = null;

/** Initialises every model on one Sequelize instance and wires the associations (once). */
export function initModels(sequelize: Sequelize) {
	if (initialised === sequelize) return;
	if (initialised) throw new Error('Models are already bound to another Sequelize instance');
	for (const model of ALL) model.initModel(sequelize);

	User.hasMany(Membership, { as: 'memberships', foreignKey: 'userId' });
	Membership.belongsTo(User, { as: 'user', foreignKey: 'userId' });
	Membership.belongsTo(Organisation, { as: 'organisation', foreignKey: 'organisationId' });
	Organisation.hasMany(Farm, { as: 'farms', foreignKey: 'organisationId' });
	Farm.belongsTo(Organisation, { as: 'organisation', foreignKey: 'organisationId' });
	Farm.belongsTo(User, { as: 'grower', foreignKey: 'growerId' });
	Farm.hasMany(Block, { as: 'blocks', foreignKey: 'farmId' });
	Block.belongsTo(Farm, { as: 'farm', foreignKey: 'farmId' });
	Block.belongsTo(Crop, { as: 'crop', foreignKey: 'cropId' });
	Block.belongsTo(Pest, { as: 'pest', foreignKey: 'pestId' });
	Block.hasMany(Visit, { as: 'visits', foreignKey: 'blockId' });
	Block.hasMany(ScoutingAssignment, { as: 'assignments', foreignKey: 'blockId' });
	Block.hasMany(Assessment, { as: 'assessments', foreignKey: 'blockId' });
	Block.hasMany(Recommendation, { as: 'recommendations', foreignKey: 'blockId' });
	ScoutingAssignment.belongsTo(Block, { as: 'block', foreignKey: 'blockId' });
	ScoutingAssignment.belongsTo(User, { as: 'scout', foreignKey: 'scoutId' });
	ThresholdRule.belongsTo(Crop, { as: 'crop', foreignKey: 'cropId' });
	ThresholdRule.belongsTo(Pest, { as: 'pest', foreignKey: 'pestId' });
	ThresholdRule.belongsTo(SampleUnit, { as: 'sampleUnit', foreignKey: 'sampleUnitId' });
	Visit.belongsTo(Block, { as: 'block', foreignKey: 'blockId' });
	Visit.belongsTo(User, { as: 'scout', foreignKey: 'scoutId' });
	Visit.belongsTo(SampleUnit, { as: 'sampleUnit', foreignKey: 'sampleUnitId' });
	Visit.hasMany(VisitCount, { as: 'counts', foreignKey: 'visitId' });
	Visit.hasMany(Photo, { as: 'photos', foreignKey: 'visitId' });
	VisitCount.belongsTo(Visit, { as: 'visit', foreignKey: 'visitId' });
	Trap.belongsTo(Farm, { as: 'farm', foreignKey: 'farmId' });
	Trap.hasMany(TrapReading, { as: 'readings', foreignKey: 'trapId' });
	TrapReading.belongsTo(Trap, { as: 'trap', foreignKey: 'trapId' });
	Assessment.belongsTo(Block, { as: 'block', foreignKey: 'blockId' });
	Recommendation.belongsTo(Block, { as: 'block', foreignKey: 'blockId' });
	Recommendation.belongsTo(Product, { as: 'product', foreignKey: 'productId' });
	Recommendation.belongsTo(User, { as: 'author', foreignKey: 'authorId' });
	Subscription.belongsTo(User, { as: 'user', foreignKey: 'userId' });
	Notification.belongsTo(User, { as: 'user', foreignKey: 'userId' });
	AuditLog.belongsTo(User, { as: 'actor', foreignKey: 'actorId' });
	// AuthAccount and AuthSession are associated by the Auth.js adapter itself.
	initialised = sequelize;
}
