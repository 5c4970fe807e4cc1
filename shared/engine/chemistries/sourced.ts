import type { Reference } from '../types'
import type { Sourced } from './types'

/** Shorthand for a value with its unit and source. */
export const sourced = <T>(value: T, unit: string, ref: Reference): Sourced<T> => ({ value, unit, ref })
