import { createHash, randomBytes, randomUUID } from 'node:crypto'
import { addDays } from 'date-fns'
import { and, asc, eq, gt, isNull } from 'drizzle-orm'
import type { Db } from '../db'
import { invites, organisations, users } from '../db/schema'
import { Conflict, NotFound, Unprocessable } from '../errors'
import { hashPassword } from '../auth/password'
import type { Clock } from '../clock'
import type { Mailer } from './mail'
import type { AcceptInviteBody, InviteBody, OrganisationDto, OrganisationPatchBody, UserDto, UserPatchBody } from '../../shared/schemas/auth'
import { ROLE_LABELS } from '../../shared/roles'

const userColumns = {
  id: users.id, email: users.email, name: users.name, role: users.role, active: users.active,
  organisation: { id: organisations.id, name: organisations.name, kind: organisations.kind, unitSystem: organisations.unitSystem },
}

export async function getUser(db: Db, id: string): Promise<UserDto> {
  const [row] = await db.select(userColumns).from(users).innerJoin(organisations, eq(users.organisationId, organisations.id)).where(eq(users.id, id))
  if (!row) throw new NotFound('User')
  return row
}

export function listUsers(db: Db): Promise<UserDto[]> {
  return db.select(userColumns).from(users).innerJoin(organisations, eq(users.organisationId, organisations.id)).orderBy(asc(organisations.name), asc(users.name))
}

export function listOrganisations(db: Db) {
  return db.select({ id: organisations.id, name: organisations.name, kind: organisations.kind, unitSystem: organisations.unitSystem })
    .from(organisations).orderBy(asc(organisations.kind), asc(organisations.name))
}

const hashToken = (token: string) => createHash('sha256').update(token).digest('hex')

/** Creates the user without a password and e-mails a one-time link that lets them set one. */
export async function inviteUser(db: Db, mailer: Mailer, clock: Clock, body: InviteBody, baseUrl: string): Promise<UserDto> {
  const [org] = await db.select().from(organisations).where(eq(organisations.id, body.organisationId))
  if (!org) throw new Unprocessable('No such organisation.', [{ path: ['organisationId'], message: 'No such organisation.' }])
  if (body.role === 'engineer' && org.kind !== 'city') throw new Unprocessable('Traffic engineers belong to a city.', [{ path: ['organisationId'], message: 'Traffic engineers belong to a city.' }])
  if ((body.role === 'planner' || body.role === 'manager') && org.kind !== 'agency') {
    throw new Unprocessable('Planners and managers belong to the agency.', [{ path: ['organisationId'], message: 'Planners and managers belong to the agency.' }])
  }
  const [existing] = await db.select({ id: users.id }).from(users).where(eq(users.email, body.email))
  if (existing) throw new Conflict('A user with this e-mail already exists.')
  const id = randomUUID()
  const token = randomBytes(32).toString('base64url')
  await db.transaction(async (tx) => {
    await tx.insert(users).values({ id, email: body.email, name: body.name, role: body.role, organisationId: org.id })
    await tx.insert(invites).values({ tokenHash: hashToken(token), userId: id, expiresAt: addDays(clock.now(), 7) })
  })
  await mailer.send({
    to: body.email,
    subject: 'You are invited to Fanlight',
    text: `Hello ${body.name},\n\nYou have been given access to Fanlight as ${ROLE_LABELS[body.role]} for ${org.name}.\n` +
      `Set your password within 7 days at:\n${baseUrl}/invite/${token}\n`,
  })
  return getUser(db, id)
}

export async function acceptInvite(db: Db, clock: Clock, body: AcceptInviteBody): Promise<UserDto> {
  const [invite] = await db.select().from(invites)
    .where(and(eq(invites.tokenHash, hashToken(body.token)), isNull(invites.usedAt), gt(invites.expiresAt, clock.now())))
  if (!invite) throw new NotFound('Invitation (it may have expired or been used)')
  const passwordHash = await hashPassword(body.password)
  await db.transaction(async (tx) => {
    await tx.update(users).set({ passwordHash }).where(eq(users.id, invite.userId))
    await tx.update(invites).set({ usedAt: clock.now() }).where(eq(invites.tokenHash, invite.tokenHash))
  })
  return getUser(db, invite.userId)
}

export async function patchUser(db: Db, actorId: string, id: string, body: UserPatchBody): Promise<UserDto> {
  const user = await getUser(db, id)
  if (id === actorId && body.active === false) throw new Conflict('You cannot deactivate yourself.')
  if (id === actorId && body.role && body.role !== 'admin') throw new Conflict('You cannot remove your own admin role.')
  if (body.role === 'engineer' && user.organisation.kind !== 'city') throw new Conflict('Traffic engineers belong to a city.')
  if ((body.role === 'planner' || body.role === 'manager') && user.organisation.kind !== 'agency') {
    throw new Conflict('Planners and managers belong to the agency.')
  }
  await db.update(users).set(body).where(eq(users.id, id))
  return getUser(db, id)
}

/** Units are an organisation's choice: everyone in it sees metric or US customary figures. */
export async function patchOrganisation(db: Db, id: string, body: OrganisationPatchBody): Promise<OrganisationDto> {
  const [row] = await db.update(organisations).set(body).where(eq(organisations.id, id))
    .returning({ id: organisations.id, name: organisations.name, kind: organisations.kind, unitSystem: organisations.unitSystem })
  if (!row) throw new NotFound('Organisation')
  return row
}
