import { SMTPServer } from 'smtp-server'
import { simpleParser } from 'mailparser'
import type { AddressInfo } from 'node:net'
import type { Db } from '../db'
import { outboxMessages } from '../db/schema'

export interface FakeSmtp {
  url: string
  close(): Promise<void>
}

/**
 * A local SMTP server for development and tests: every message it receives is stored in the
 * outbox table, where admins read it. Listens on loopback only, on a free port.
 */
export async function startFakeSmtp(db: Db): Promise<FakeSmtp> {
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS'],
    logger: false,
    onData(stream, _session, callback) {
      simpleParser(stream)
        .then(async (mail) => {
          const to = Array.isArray(mail.to) ? mail.to.map((a) => a.text).join(', ') : (mail.to?.text ?? '')
          await db.insert(outboxMessages).values({
            to,
            from: mail.from?.text ?? '',
            subject: mail.subject ?? '',
            text: (mail.text ?? '').trimEnd(),
          })
          callback()
        })
        .catch((err: Error) => callback(err))
    },
  })
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve))
  const { port } = server.server.address() as AddressInfo
  return {
    url: `smtp://127.0.0.1:${port}`,
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  }
}
