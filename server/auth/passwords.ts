// Password hashing with bcrypt at cost 10, the floor the OWASP Password Storage Cheat Sheet sets.
// bcrypt reads only the first 72 bytes, so longer passwords are refused at the form.
import bcrypt from 'bcryptjs';

export const BCRYPT_COST = 10;

export const hashPassword = (password: string, cost = BCRYPT_COST) => bcrypt.hash(password, cost);
export const verifyPassword = (password: string, hash: string) => bcrypt.compare(password, hash);
