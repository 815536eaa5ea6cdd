import { Hash } from '@adonisjs/hash'
import { Scrypt } from '@adonisjs/hash/drivers/scrypt'

// The same hasher, with the same default options, that nuxt-auth-utils' hashPassword uses,
// so accounts created here sign in through the app.
const hash = new Hash(new Scrypt({}))

export function hashPassword(password: string) {
  return hash.make(password)
}
