import { randomUUID } from 'node:crypto';
import { Op } from 'sequelize';
import { badRequest, conflict } from '../errors';
import { Bike, ChatCursor, CheckIn, Consent, Consultation, ConsultationEvent, FitterNote, Intake, Message, Payment, PaymentCustomer, PhotoMeasurement, Plan, Referral, RiderProfile, Session, SetupSnapshot, Upload, User } from '../models';
import type { AppContext } from '../context';
import type { PasswordHasher } from './passwords';
import { recordAudit, type AuditActor } from './audit';
import { removeStoredFiles } from './upload-storage';

/**
 * Erase a rider's account. Health data (intakes, consents, photos and clips, measurements,
 * check-ins, plans, setups, chat threads, fitters' notes, referrals) is deleted and the files are
 * removed from disk. What stays, for the clinic's accounts: consultations (times and fees) and
 * payments, tied to an anonymous placeholder account that can never sign in. The consultations'
 * history keeps its moves but loses its notes (hold reasons are health text: "Urgent warning
 * signs…", the physio's own words), and the physio flag goes. The audit log is append-only and
 * keeps its rows, which carry only ids and action names (see `auditDetail`).
 */
export async function deleteRiderAccount(ctx: AppContext, rider: Express.User, password: string, hasher: PasswordHasher, actor: AuditActor) {
  const user = await User.findByPk(rider.id);
  if (!user || !(await hasher.verify(password, user.passwordHash))) throw badRequest('That password is not right.', { password: 'That password is not right.' });
  const upcoming = await Consultation.count({ where: { riderId: user.id, status: { [Op.in]: ['requested', 'awaiting_payment', 'booked'] }, startsAt: { [Op.gt]: new Date() } } });
  if (upcoming > 0) throw conflict('You have a session booked. Cancel it first (the refund policy applies), then delete your account.');

  const uploads = await Upload.findAll({ where: { riderId: user.id } });
  const fileNames = uploads.flatMap((u) => [u.storageName, ...(u.thumbnailName ? [u.thumbnailName] : [])]);
  await ctx.sequelize.transaction(async (transaction) => {
    const riderId = user.id;
    const consultationIds = (await Consultation.findAll({ where: { riderId }, attributes: ['id'], transaction })).map((c) => c.id);
    const inConsultations = { consultationId: { [Op.in]: consultationIds } };
    await recordAudit(actor, { action: 'account.delete', subjectType: 'user', subjectId: riderId, subjectUserId: riderId }, { transaction });
    await CheckIn.destroy({ where: { riderId }, transaction });
    await Plan.destroy({ where: { riderId }, transaction }); // plan steps go with their plans
    await Referral.destroy({ where: { riderId }, transaction });
    if (consultationIds.length) {
      await Message.destroy({ where: inConsultations, transaction });
      await ChatCursor.destroy({ where: inConsultations, transaction });
      await FitterNote.destroy({ where: inConsultations, transaction });
      await ConsultationEvent.update({ note: null }, { where: inConsultations, transaction });
      await Consultation.update({ intakeId: null, cancelReason: null, flaggedForPhysio: false }, { where: { id: { [Op.in]: consultationIds } }, transaction });
    }
    if (uploads.length) await PhotoMeasurement.destroy({ where: { uploadId: { [Op.in]: uploads.map((u) => u.id) } }, transaction });
    await Upload.destroy({ where: { riderId }, transaction });
    const bikeIds = (await Bike.findAll({ where: { riderId }, attributes: ['id'], transaction })).map((b) => b.id);
    // Snapshots refuse deletes in normal running; erasing an account is the one exception.
    if (bikeIds.length) await SetupSnapshot.destroy({ where: { bikeId: { [Op.in]: bikeIds } }, transaction, hooks: false });
    await Bike.destroy({ where: { riderId }, transaction });
    await Intake.destroy({ where: { riderId }, transaction });
    await Consent.destroy({ where: { userId: riderId }, transaction });
    await RiderProfile.destroy({ where: { userId: riderId }, transaction });
    await PaymentCustomer.destroy({ where: { userId: riderId }, transaction });
    // The Stripe customer id leads back to the person's e-mail at Stripe; the charge id is enough for refunds.
    await Payment.update({ riderId: null, stripeCustomerId: null }, { where: { riderId }, transaction });
    await Session.destroy({ where: { userId: riderId }, transaction });
    await user.update(
      { email: `deleted-${riderId}-${randomUUID().slice(0, 8)}@deleted.invalid`, displayName: 'Deleted rider', passwordHash: '!', status: 'disabled', timeZone: 'UTC', lastSignInAt: null },
      { transaction },
    );
  });
  await removeStoredFiles(ctx.config, fileNames);
}
