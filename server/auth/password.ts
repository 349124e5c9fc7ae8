import bcrypt from "bcryptjs";

/** bcrypt hashes with a per-hash salt; the cost comes from config (lower in tests only). */
export const hashPassword = (plain: string, rounds: number) => bcrypt.hash(plain, rounds);

export const verifyPassword = (plain: string, hash: string) => bcrypt.compare(plain, hash);

/** A fixed hash compared against when the e-mail is unknown, so both failures take the same time. */
export const DUMMY_HASH = bcrypt.hashSync("not-a-real-password", 10);
