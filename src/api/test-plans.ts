/** Plans of a site's full-duration tests. */
import type { TestPlanRequestInput } from '@shared/schemas/test-plan.schema'
import type { Answer } from '@shared/schemas/answers/common'
import type { TestPlanAnswer } from '@shared/schemas/answers/test-plans'
import { http } from './http'

export type StoredPlan = Answer<typeof TestPlanAnswer>

export const makeTestPlan = (siteId: string, body: TestPlanRequestInput) => http.post<StoredPlan>(`/sites/${siteId}/test-plans`, body)
export const fetchTestPlans = (siteId: string) => http.get<{ plans: StoredPlan[] }>(`/sites/${siteId}/test-plans`)
export const fetchTestPlan = (siteId: string, planId: string) => http.get<StoredPlan>(`/sites/${siteId}/test-plans/${planId}`)
/** A plain link: the browser downloads the PDF with the session cookie. */
export const workOrderUrl = (siteId: string, planId: string) => `/api/sites/${siteId}/test-plans/${planId}/work-order.pdf`
