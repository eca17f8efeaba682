import type { Setup } from '@shared/fit/setup';
import { currentConsent, type IntakeSubmitParsed, type ProfileParsed } from '@shared/rider';
import { Bike, Consent, Intake, RiderProfile, User } from '../models';
import { consentTextHash } from '../services/consents';
import { computeTriage } from '../services/intakes';
import { recordSnapshot } from '../services/setup-history';

/**
 * The demo riders' profiles, bikes and (for Ben) a submitted intake. Every number is invented
 * for the demo; none is a real person's measurement.
 */
interface DemoRider {
  email: string;
  profile: Omit<ProfileParsed, 'unit'> & { unit: 'mm' | 'in' };
  bike: { name: string; kind: Bike['kind']; notes: string; setup: Setup; cleatNotes: string; takenOn: string };
  intake?: Omit<IntakeSubmitParsed, 'consent' | 'bikeId'>;
}

const DEMO_RIDERS: DemoRider[] = [
  {
    email: 'ben@rider.example',
    profile: { unit: 'mm', height: 1835, inseam: 872, birthYear: 1979, flexibility: 'limited', ridingStyle: 'road', hoursPerWeek: 7, ridesPerWeek: 4, injuryHistory: 'Keyhole trim of the right meniscus in 2016; no trouble since.' },
    bike: {
      name: 'Green road bike', kind: 'road', notes: 'Bought second-hand last spring.',
      setup: { saddleHeight: 752, saddleSetback: 62, saddleTilt: -1, reach: 560, drop: 85, stemLength: 110, spacerStack: 15, crankLength: 175, stack: 22, cleatForeAft: 0, cleatRotation: 0 },
      cleatNotes: 'Cleats under the ball of the foot, no wedges.', takenOn: '2026-11-20',
    },
    intake: {
      symptoms: [{ region: 'knee-front-left', pain: 5, kind: 'ache', timing: ['during-ride', 'after-ride'], durationDays: 60, numbness: false, swelling: false, afterCrash: false }],
      redFlagAnswers: {
        'saddle-numbness-persists': false, 'bladder-bowel-change': false, 'leg-weakness': false, 'hot-swollen-joint': false, 'fever-with-pain': false,
        'saddle-numbness-riding': false, 'back-pain': false, 'pain-at-rest-or-night': false, 'swelling-locking-giving-way': false,
        'numbness-persists-off-bike': false, 'severe-pain': false, 'crash-or-fall': false, 'not-settled-after-changes': false,
      },
      goals: ['ride-without-pain', 'event'],
      goalNotes: 'Finish a 160 km gravel event in June without the knee complaining.',
    },
  },
  {
    email: 'carla@rider.example',
    profile: { unit: 'in', height: 1640, inseam: 768, birthYear: 1990, flexibility: 'good', ridingStyle: 'gravel', hoursPerWeek: 5, ridesPerWeek: 3, injuryHistory: '' },
    bike: {
      name: 'Sand gravel bike', kind: 'gravel', notes: '',
      setup: { saddleHeight: 676, saddleSetback: 48, saddleTilt: 0, reach: 505, drop: 40, stemLength: 80, spacerStack: 25, crankLength: 170, stack: 20, cleatForeAft: 2, cleatRotation: 3 },
      cleatNotes: 'Left cleat turned slightly out.', takenOn: '2026-11-28',
    },
    intake: {
      symptoms: [{ region: 'hand-left', pain: 3, kind: 'tingling', timing: ['during-ride'], durationDays: 45, numbness: false, swelling: false, afterCrash: false }],
      redFlagAnswers: {
        'saddle-numbness-persists': false, 'bladder-bowel-change': false, 'leg-weakness': false, 'hot-swollen-joint': false, 'fever-with-pain': false,
        'saddle-numbness-riding': false, 'back-pain': false, 'pain-at-rest-or-night': false, 'swelling-locking-giving-way': false,
        'numbness-persists-off-bike': false, 'severe-pain': false, 'crash-or-fall': false, 'not-settled-after-changes': false,
      },
      goals: ['more-comfort', 'ride-longer'],
      goalNotes: 'Ride a whole gravel day without my left hand going fuzzy.',
    },
  },
  {
    email: 'deshawn@rider.example',
    profile: { unit: 'mm', height: 1910, inseam: 915, birthYear: 1995, flexibility: 'average', ridingStyle: 'triathlon-tt', hoursPerWeek: 9, ridesPerWeek: 6, injuryHistory: 'Broken left collarbone in 2021, plated.' },
    bike: {
      name: 'Black time-trial bike', kind: 'tt-triathlon', notes: 'Race bike; also rides a road bike in winter.',
      setup: { saddleHeight: 805, saddleSetback: 10, saddleTilt: -3, reach: 610, drop: 120, stemLength: 90, spacerStack: 10, crankLength: 170, stack: 24, cleatForeAft: 0, cleatRotation: 1 },
      cleatNotes: '', takenOn: '2026-11-15',
    },
  },
];

/** Idempotent: each part is added only when the rider has none yet, so demo changes survive restarts. */
export async function seedDemoRiders(): Promise<void> {
  for (const demo of DEMO_RIDERS) {
    const user = await User.findOne({ where: { email: demo.email } });
    if (!user) continue;
    if (!(await RiderProfile.findByPk(user.id))) {
      const p = demo.profile;
      await RiderProfile.create({
        userId: user.id, unitPreference: p.unit, heightMm: p.height, inseamMm: p.inseam, birthYear: p.birthYear, flexibility: p.flexibility,
        ridingStyle: p.ridingStyle, hoursPerWeek: p.hoursPerWeek, ridesPerWeek: p.ridesPerWeek, injuryHistory: p.injuryHistory,
      });
    }
    let bike = await Bike.findOne({ where: { riderId: user.id }, order: [['id', 'ASC']] });
    if (!bike) {
      const b = demo.bike;
      bike = await Bike.sequelize!.transaction(async (transaction) => {
        const created = await Bike.create({ riderId: user.id, name: b.name, kind: b.kind, notes: b.notes }, { transaction });
        await recordSnapshot(created.id, b.setup, 'baseline', user.id, { cleatNotes: b.cleatNotes, takenOn: b.takenOn, transaction });
        return created;
      });
    }
    if (demo.intake && (await Intake.count({ where: { riderId: user.id } })) === 0) await seedIntake(user, bike, demo.intake);
  }
}

async function seedIntake(user: User, bike: Bike, answers: NonNullable<DemoRider['intake']>): Promise<void> {
  const text = currentConsent('store-health-data')!;
  const profile = await RiderProfile.findByPk(user.id);
  await Intake.sequelize!.transaction(async (transaction) => {
    const consent = await Consent.create({ userId: user.id, kind: 'store-health-data', version: text.version, textHash: consentTextHash(text.text), scopeType: null, scopeId: null, givenAt: new Date() }, { transaction });
    const triage = computeTriage(answers.symptoms, answers.redFlagAnswers, profile?.birthYear ?? null);
    await Intake.create(
      { riderId: user.id, status: 'submitted', ...answers, bikeId: bike.id, triageLevel: triage.level, triage, consentId: consent.id, submittedAt: new Date() },
      { transaction },
    );
  });
}
