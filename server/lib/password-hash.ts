/**
 * bcrypt off the event loop: @node-rs/bcrypt hashes and compares on libuv's thread pool, so a burst
 * of sign-ups or sign-ins does not stall every other request. At most (CPUs − 1, at least 1) run at
 * once, so the event loop keeps a core of its own; the rest wait their turn.
 */
import os from 'node:os'
import { hash, verify } from '@node-rs/bcrypt'

const slots = Math.max(1, os.availableParallelism() - 1)
let running = 0
const waiting: Array<() => void> = []

async function inTurn<T>(work: () => Promise<T>): Promise<T> {
  if (running >= slots) await new Promise<void>((resolve) => waiting.push(resolve))
  running++
  try {
    return await work()
  } finally {
    running--
    waiting.shift()?.()
  }
}

export function bcryptHash(password: string, cost: number): Promise<string> {
  return inTurn(() => hash(password, cost))
}

export function bcryptVerify(password: string, stored: string): Promise<boolean> {
  return inTurn(() => verify(password, stored))
}
