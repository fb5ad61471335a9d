import { createSequelize } from './connection';
import { Account, Session, VerificationToken } from './models/auth-records';
import { Division } from './models/division';
import { DuesPeriod } from './models/dues-period';
import { Entry } from './models/entry';
import { Membership } from './models/membership';
import { Payment } from './models/payment';
import { Refund } from './models/refund';
import { Scale } from './models/scale';
import { Show } from './models/show';
import { ShowClass } from './models/show-class';
import { Society } from './models/society';
import { User } from './models/user';
import { Variety } from './models/variety';

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

DuesPeriod.belongsTo(Society, { foreignKey: 'societyId', as: 'society' });
Payment.belongsTo(Society, { foreignKey: 'societyId', as: 'society' });
Payment.belongsTo(User, { foreignKey: 'userId', as: 'user' });
Refund.belongsTo(Payment, { foreignKey: 'paymentId', as: 'payment' });

export {
	Account,
	Division,
	DuesPeriod,
	Entry,
	Membership,
	Payment,
	Refund,
	Scale,
	Session,
	Show,
	ShowClass,
	Society,
	User,
	Variety,
	VerificationToken
};
