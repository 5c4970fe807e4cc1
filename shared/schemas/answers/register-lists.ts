/** Answers of the register's lists across sites (GET /api/luminaires, GET /api/tests). */
import { z } from 'zod'
import { ATTENTION_STATES, listAnswer } from '../list.schema'
import { LogBookEntryAnswer, LuminaireStatusAnswer } from './register'

export const LuminaireListItemAnswer = LuminaireStatusAnswer.extend({
  siteName: z.string(),
  /** Which of the list's states it is in (empty when nothing needs attention). */
  states: z.array(z.enum(ATTENTION_STATES)),
})

export const LuminaireListAnswer = listAnswer(LuminaireListItemAnswer)

export const TestListAnswer = listAnswer(LogBookEntryAnswer)
