import bcrypt from 'bcryptjs';

/** bcrypt cost 12: above the OWASP minimum of 10 and about a quarter second here. */
export const BCRYPT_COST = 12;

export const hashPassword = (plain: string): Promise<string> => bcrypt.hash(plain, BCRYPT_COST);
export const checkPassword = (plain: string, hash: string): Promise<boolean> => bcrypt.compare(plain, hash);

/** A hash to compare against when the e-mail is unknown, so both failures take the same time. */
export const DUMMY_HASH = bcrypt.hashSync('no-such-user-password', BCRYPT_COST);
