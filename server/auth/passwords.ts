// Password hashing, on its own so the demo seed hashes at the same cost as the app.
import bcrypt from 'bcryptjs';

/** bcrypt cost; 12 rounds ≈ 0.2 s here (OWASP password storage cheat sheet asks ≥ 10). */
export const BCRYPT_ROUNDS = 12;

export const hashPassword = (password: string): Promise<string> => bcrypt.hash(password, BCRYPT_ROUNDS);
