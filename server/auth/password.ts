import { hash, verify } from '@node-rs/argon2'

// Argon2id (the library's default, value 2 of its const enum) with OWASP's minimum parameters.
const OPTIONS = { algorithm: 2, memoryCost: 19456, timeCost: 2, parallelism: 1 } as const

export function hashPassword(password: string): Promise<string> {
  return hash(password, OPTIONS)
}

export function verifyPassword(passwordHash: string, password: string): Promise<boolean> {
  return verify(passwordHash, password)
}

let dummy: Promise<string> | undefined
/** Verifies against a throwaway hash so unknown e-mails cost as much time as wrong passwords. */
export async function burnVerify(password: string): Promise<void> {
  dummy ??= hashPassword('not-a-real-password')
  await verify(await dummy, password)
}
