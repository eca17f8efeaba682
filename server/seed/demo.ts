import type { PasswordHasher } from '../services/passwords';
import { upsertUser } from '../services/users';
import { DEMO_PASSWORD, DEMO_PEOPLE } from './demo-people';
import { seedDemoRiders } from './demo-riders';
import { seedDemoFitting } from './demo-fitting';
import { seedDemoCare } from './demo-care';
import { seedDemoPayments } from './demo-payments';
import type { AppContext } from '../context';

/**
 * Load the demo scenario. Idempotent: people are found by e-mail and never duplicated, and
 * nothing a demo user changed is overwritten, so running it on every start is safe.
 */
export async function seedDemo(ctx: AppContext, hasher: PasswordHasher): Promise<{ created: number }> {
  let created = 0;
  for (const person of DEMO_PEOPLE) {
    const result = await upsertUser({ ...person, password: DEMO_PASSWORD }, hasher);
    if (result.created) created += 1;
  }
  await seedDemoRiders();
  await seedDemoFitting(ctx);
  await seedDemoCare();
  await seedDemoPayments(ctx);
  return { created };
}
