import { dataSource } from '../../data-source'
import { User } from './user.entity'

export const users = () => dataSource.getRepository(User)

export function findUserByEmail(email: string) {
  return users().findOne({ where: { email: email.toLowerCase() } })
}

export function findUserById(id: string) {
  return users().findOne({ where: { id } })
}
