/**
 * Escape-route spacing: the largest distance between emergency luminaires in a long row, and
 * from the last luminaire to the end of the route, such that the floor illuminance meets a
 * chosen criterion. Point-by-point method with the inverse-square cosine law
 * E = I(C,γ)·cos³γ / h², direct light only, summed over every luminaire that contributes.
 *
 * illuminance.ts  point illuminance        criteria.ts   what each criterion asks, where
 * row-solver.ts   long-row spacing, ends   glare.ts      EN 1838 glare limits
 * row-symmetry.ts  table symmetries the solver uses, golden-section search
 * layout.ts       a finite route laid out  input.ts      tool input and result
 * tool.ts         computeSpacing, the tool
 * emphasis*.ts    points that need a luminaire within 2 m, and the layout that serves them
 */
export * from './illuminance'
export * from './criteria'
export * from './row-solver'
export * from './row-symmetry'
export * from './layout'
export * from './emphasis-points'
export * from './emphasis'
export * from './glare'
export * from './input'
export * from './tool'
