/**
 * Logs never carry secrets: share and invitation tokens are cut out of request paths, and an
 * error's SQL parameters and row details are left out of the error log.
 */
import { EventEmitter } from 'node:events'
import type { Request, Response } from 'express'
import { afterEach, describe, expect, it, vi } from 'vitest'
import { QueryFailedError } from 'typeorm'
import { errorForLog, loggablePath } from '../../server/lib/log-redact'
import { logger } from '../../server/lib/logger'
import { requestLog } from '../../server/middleware/request-log'
import { errorHandler } from '../../server/middleware/error-handler'

afterEach(() => {
  vi.restoreAllMocks()
})

function failedInsert() {
  const driverError = Object.assign(new Error('duplicate key value violates unique constraint "users_email_key"'), {
    code: '23505',
    detail: 'Key (email)=(secret.person@test.example) already exists.',
  })
  return new QueryFailedError('INSERT INTO users (email, password_hash) VALUES ($1, $2)', ['secret.person@test.example', '$2b$12$hash'], driverError)
}

const TOKEN = 'kP3v9QxZ2mN8rT5wY1aB4cD7eF0gH6jK9lM2nP5qR8s'

describe('log redaction', () => {
  it.each([
    [`/api/invitations/${TOKEN}`, '/api/invitations/[redacted]'],
    [`/api/invitations/${TOKEN}/accept?x=1`, '/api/invitations/[redacted]/accept'],
    [`/api/share/${TOKEN}/pdf`, '/api/share/[redacted]/pdf'],
    [`/api/logbook-links/${TOKEN}`, '/api/logbook-links/[redacted]'],
    [`/api/logbook-links/${TOKEN}/pdf`, '/api/logbook-links/[redacted]/pdf'],
    ['/api/sheets/0b6d3f0e-6c7a-4f8e-9a51-2f4c1d7e8a90', '/api/sheets/0b6d3f0e-6c7a-4f8e-9a51-2f4c1d7e8a90'],
    ['/api/calc/size', '/api/calc/size'],
  ])('request path %s is logged as %s', (path, logged) => {
    expect(loggablePath(path)).toBe(logged)
  })

  it('the request log of an invitation link carries no token', () => {
    const lines: unknown[] = []
    vi.spyOn(logger, 'info').mockImplementation(((obj: unknown) => void lines.push(obj)) as never)
    const res = Object.assign(new EventEmitter(), { statusCode: 200 }) as unknown as Response
    requestLog({ method: 'POST', originalUrl: `/api/invitations/${TOKEN}/accept` } as Request, res, () => undefined)
    res.emit('finish')
    expect(lines).toHaveLength(1)
    expect(JSON.stringify(lines[0])).not.toContain(TOKEN)
  })

  it('the error log of a failed query carries neither its parameters nor the row detail', () => {
    const lines: unknown[] = []
    vi.spyOn(logger, 'error').mockImplementation(((obj: unknown) => void lines.push(obj)) as never)
    const res = { headersSent: false, status: () => res, json: () => res, set: () => res } as unknown as Response
    errorHandler(failedInsert(), { path: '/api/auth/sign-up', originalUrl: '/api/auth/sign-up' } as Request, res, () => undefined)
    expect(lines).toHaveLength(1)
    const logged = JSON.stringify(lines[0], (_k, v: unknown) => (v instanceof Error ? { ...v, message: v.message } : v))
    expect(logged).not.toContain('secret.person@test.example')
    expect(logged).not.toContain('$2b$12$hash')
  })

  it('the request log of a log book link carries no token', () => {
    const lines: unknown[] = []
    vi.spyOn(logger, 'info').mockImplementation(((obj: unknown) => void lines.push(obj)) as never)
    const res = Object.assign(new EventEmitter(), { statusCode: 200 }) as unknown as Response
    requestLog({ method: 'GET', originalUrl: `/api/logbook-links/${TOKEN}/pdf` } as Request, res, () => undefined)
    res.emit('finish')
    expect(lines).toHaveLength(1)
    expect(JSON.stringify(lines[0])).not.toContain(TOKEN)
    expect(JSON.stringify(lines[0])).toContain('/api/logbook-links/[redacted]/pdf')
  })

  it("errorForLog leaves a failed query's parameters and row details out", () => {
    const err = failedInsert()
    const logged = JSON.stringify(errorForLog(err))
    expect(logged).not.toContain('secret.person@test.example')
    expect(logged).not.toContain('$2b$12$hash')
    expect(logged).toContain('23505')
    expect(logged).toContain('users_email_key')
  })
})
