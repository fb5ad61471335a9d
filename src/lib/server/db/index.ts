import { createSequelize } from './connection';
import { Account, Session, VerificationToken } from './models/auth-records';
import { AuditEvent } from './models/audit-event';
import { Division } from './models/division';
import { DuesPeriod } from './models/dues-period';
import { Entry } from './models/entry';
import { MailPreference } from './models/mail-preference';
import { EntryPhoto } from './models/entry-photo';
import { Membership } from './models/membership';
import { Payment } from './models/payment';
import { Refund } from './models/refund';
import { Plant } from './models/plant';
import { PlantEvent } from './models/plant-event';
import { PlantPhoto } from './models/plant-photo';
import { Panel } from './models/panel';
import { PanelClass } from './models/panel-class';
import { PanelJudge } from './models/panel-judge';
import { Scale } from './models/scale';
import { ScoreSheet } from './models/score-sheet';
import { Show } from './models/show';
import { ShowClass } from './models/show-class';
import { Society } from './models/society';
import { User } from './models/user';
import { Variety } from './models/variety';
import { WalkInExhibitor } from './models/walk-in-exhibitor';

/** The process's one Sequelize instance. Models are initialised and associated here. */
export const sequelize = createSequelize();

User.initModel(sequelize);
Account.initModel(sequelize);
Session.initModel(sequelize);
VerificationToken.initModel(sequelize);
Society.initModel(sequelize);
Membership.initModel(sequelize);
Variety.initModel(sequelize);
Scale.initModel(sequelize);
Show.initModel(sequelize);
Division.initModel(sequelize);
ShowClass.initModel(sequelize);
Entry.initModel(sequelize);
DuesPeriod.initModel(sequelize);
Payment.initModel(sequelize);
Refund.initModel(sequelize);
// The member's collection (issue 6)
Plant.initModel(sequelize);
PlantEvent.initModel(sequelize);
PlantPhoto.initModel(sequelize);
MailPreference.initModel(sequelize);
Panel.initModel(sequelize);
PanelJudge.initModel(sequelize);
PanelClass.initModel(sequelize);
ScoreSheet.initModel(sequelize);
EntryPhoto.initModel(sequelize);
// The audit log of destructive actions (issue 9)
AuditEvent.initModel(sequelize);
WalkInExhibitor.initModel(sequelize);

Membership.belongsTo(Society, { foreignKey: 'societyId', as: 'society' });
Membership.belongsTo(User, { foreignKey: 'userId', as: 'user' });
Society.hasMany(Membership, { foreignKey: 'societyId', as: 'memberships' });
User.hasMany(Membership, { foreignKey: 'userId', as: 'memberships' });

Variety.belongsTo(Society, { foreignKey: 'societyId', as: 'society' });
Scale.belongsTo(Society, { foreignKey: 'societyId', as: 'society' });

Show.belongsTo(Society, { foreignKey: 'societyId', as: 'society' });
Society.hasMany(Show, { foreignKey: 'societyId', as: 'shows' });
Division.belongsTo(Show, { foreignKey: 'showId', as: 'show' });
Show.hasMany(Division, { foreignKey: 'showId', as: 'divisions' });
ShowClass.belongsTo(Show, { foreignKey: 'showId', as: 'show' });
ShowClass.belongsTo(Division, { foreignKey: 'divisionId', as: 'division' });
ShowClass.belongsTo(Scale, { foreignKey: 'scaleId', as: 'scale' });
Division.hasMany(ShowClass, { foreignKey: 'divisionId', as: 'classes' });

Entry.belongsTo(Show, { foreignKey: 'showId', as: 'show' });
Entry.belongsTo(ShowClass, { foreignKey: 'classId', as: 'showClass' });
Entry.belongsTo(User, { foreignKey: 'exhibitorId', as: 'exhibitor' });
Entry.belongsTo(Variety, { foreignKey: 'varietyId', as: 'variety' });
ShowClass.hasMany(Entry, { foreignKey: 'classId', as: 'entries' });
EntryPhoto.belongsTo(Entry, { foreignKey: 'entryId', as: 'entry' });
Entry.hasMany(EntryPhoto, { foreignKey: 'entryId', as: 'photos' });

DuesPeriod.belongsTo(Society, { foreignKey: 'societyId', as: 'society' });
Payment.belongsTo(Society, { foreignKey: 'societyId', as: 'society' });
Payment.belongsTo(User, { foreignKey: 'userId', as: 'user' });
Refund.belongsTo(Payment, { foreignKey: 'paymentId', as: 'payment' });
Plant.belongsTo(User, { foreignKey: 'ownerId', as: 'owner' });
Plant.belongsTo(Variety, { foreignKey: 'varietyId', as: 'variety' });
Plant.belongsTo(Plant, { foreignKey: 'parentId', as: 'parent' });
Plant.hasMany(PlantEvent, { foreignKey: 'plantId', as: 'events' });
Plant.hasMany(PlantPhoto, { foreignKey: 'plantId', as: 'photos' });
PlantEvent.belongsTo(Plant, { foreignKey: 'plantId', as: 'plant' });
PlantPhoto.belongsTo(Plant, { foreignKey: 'plantId', as: 'plant' });
MailPreference.belongsTo(User, { foreignKey: 'userId', as: 'user' });
WalkInExhibitor.belongsTo(Society, { foreignKey: 'societyId', as: 'society' });
WalkInExhibitor.belongsTo(User, { foreignKey: 'userId', as: 'user' });
Panel.belongsTo(Show, { foreignKey: 'showId', as: 'show' });
Show.hasMany(Panel, { foreignKey: 'showId', as: 'panels' });

export {
	Account,
	AuditEvent,
	Division,
	DuesPeriod,
	Entry,
	MailPreference,
	EntryPhoto,
	Membership,
	Payment,
	Refund,
	Plant,
	PlantEvent,
	PlantPhoto,
	Panel,
	PanelClass,
	PanelJudge,
	Scale,
	ScoreSheet,
	Session,
	Show,
	ShowClass,
	Society,
	User,
	Variety,
	VerificationToken,
	WalkInExhibitor
};
