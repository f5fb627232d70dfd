import bcrypt from 'bcryptjs';

export const BCRYPT_COST = 12;

export const hashPassword = (password: string): Promise<string> => bcrypt.hash(password, BCRYPT_COST);

export const verifyPassword = (password: string, hash: string): Promise<boolean> => bcrypt.compare(password, hash);

// A cost-12 hash of a random string nobody knows: compared against when the e-mail is unknown,
// so a wrong address takes as long as a wrong password.
const DUMMY_HASH = '$2b$12$K2dq7PDAFs7L/w27nsbJT.s0WMI02iWw.PWpFHX9Vut7gEBgVRC2q';

export async function burnTime(password: string): Promise<void> {
  await bcrypt.compare(password, DUMMY_HASH);
}
