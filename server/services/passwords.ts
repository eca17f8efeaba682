import bcrypt from 'bcryptjs';

/**
 * bcrypt with a configurable cost (never below 10, checked by the config schema).
 * A fixed dummy hash lets a sign-in for an unknown e-mail take as long as a real one,
 * so timing does not reveal which e-mails have accounts.
 */
export function createPasswordHasher(cost: number) {
  const dummyHash = bcrypt.hashSync('saddlestep-timing-equaliser', cost);
  return {
    hash: (password: string) => bcrypt.hash(password, cost),
    verify: (password: string, hash: string) => bcrypt.compare(password, hash),
    /** Burn the same time as a real comparison; always false. */
    verifyAgainstNothing: async (password: string) => {
      await bcrypt.compare(password, dummyHash);
      return false;
    },
  };
}
export type PasswordHasher = ReturnType<typeof createPasswordHasher>;
