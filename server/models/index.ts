import type { Sequelize } from 'sequelize';
import { AuditEntry } from './audit-entry';
import { Session } from './session';
import { User } from './user';
import { Consultation } from './consultation';
import { ConsultationEvent } from './consultation-event';
import { RiderProfile } from './rider-profile';
import { Bike } from './bike';
import { SetupSnapshot } from './setup-snapshot';
import { Consent } from './consent';
import { Intake } from './intake';
import { Upload } from './upload';

export { Bike, Consent, Intake, RiderProfile, SetupSnapshot, Upload };
import { FitterProfile } from './fitter-profile';
import { Payment } from './payment';
import { PaymentCustomer } from './payment-customer';
import { Refund } from './refund';
import { StripeEvent } from './stripe-event';
import { ScheduledJob } from './scheduled-job';
import { ClinicSettings } from './clinic-settings';
import { Message } from './message';
import { ChatCursor } from './chat-cursor';

import { Plan } from './plan';
import { PlanStep } from './plan-step';
import { FitterNote } from './fitter-note';
import { PhotoMeasurement } from './photo-measurement';

import { CheckIn } from './check-in';
import { Referral } from './referral';

export { ChatCursor, CheckIn, FitterNote, Message, PhotoMeasurement, Plan, PlanStep, Referral };

export { AuditEntry, ClinicSettings, Consultation, ConsultationEvent, FitterProfile, Payment, PaymentCustomer, Refund, ScheduledJob, Session, StripeEvent, User };

/** Initialise every model and wire associations once. */
export function initModels(sequelize: Sequelize) {
  User.initModel(sequelize);
  Session.initModel(sequelize);
  AuditEntry.initModel(sequelize);
  Consultation.initModel(sequelize);
  ConsultationEvent.initModel(sequelize);
  RiderProfile.initModel(sequelize);
  Bike.initModel(sequelize);
  SetupSnapshot.initModel(sequelize);
  Consent.initModel(sequelize);
  Intake.initModel(sequelize);
  Upload.initModel(sequelize);
  FitterProfile.initModel(sequelize);
  Payment.initModel(sequelize);
  PaymentCustomer.initModel(sequelize);
  Refund.initModel(sequelize);
  StripeEvent.initModel(sequelize);
  ScheduledJob.initModel(sequelize);
  ClinicSettings.initModel(sequelize);
  Message.initModel(sequelize);
  ChatCursor.initModel(sequelize);
  Plan.initModel(sequelize);
  PlanStep.initModel(sequelize);
  FitterNote.initModel(sequelize);
  PhotoMeasurement.initModel(sequelize);
  CheckIn.initModel(sequelize);
  Referral.initModel(sequelize);
  Plan.hasMany(PlanStep, { foreignKey: 'planId', as: 'stepRows' });

  Session.belongsTo(User, { foreignKey: 'userId', as: 'user' });
  AuditEntry.belongsTo(User, { foreignKey: 'actorId', as: 'actor', constraints: false });

  Consultation.belongsTo(User, { foreignKey: 'riderId', as: 'rider' });
  Consultation.belongsTo(User, { foreignKey: 'fitterId', as: 'fitter' });
  Consultation.hasMany(ConsultationEvent, { foreignKey: 'consultationId', as: 'events' });
  User.hasOne(RiderProfile, { foreignKey: 'userId', as: 'riderProfile' });
  Bike.hasMany(SetupSnapshot, { foreignKey: 'bikeId', as: 'snapshots' });
  Intake.belongsTo(Consent, { foreignKey: 'consentId', as: 'consent' });
  Intake.hasMany(Upload, { foreignKey: 'intakeId', as: 'uploads' });
  Consultation.hasMany(Payment, { foreignKey: 'consultationId', as: 'payments' });
  Payment.hasMany(Refund, { foreignKey: 'paymentId', as: 'refunds' });
  User.hasOne(FitterProfile, { foreignKey: 'userId', as: 'fitterProfile' });
  FitterProfile.belongsTo(User, { foreignKey: 'userId', as: 'user' });

  return { User, Session, AuditEntry, Consultation, ConsultationEvent };
}
export type Models = ReturnType<typeof initModels>;
