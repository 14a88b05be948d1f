import bcrypt from 'bcryptjs';

// bcrypt cost 11: about 100 ms here, slow enough for stolen hashes, quick enough for sign-in.
const COST = 11;
export const hashPassword = (plain: string) => bcrypt.hash(plain, COST);
export const verifyPassword = (plain: string, hash: string) => bcrypt.compare(plain, hash);
