import type { DataSource } from 'typeorm';
import type { GlobalRole } from '../../shared/api/roles.js';
import { MailMessage, User } from '../db/entities/index.js';

export function adminRepository(ds: DataSource) {
  const users = ds.getRepository(User);
  const mail = ds.getRepository(MailMessage);
  return {
    users: () => users.find({ relations: { memberships: { studio: true } }, order: { name: 'ASC', id: 'ASC' } }),
    user: (id: number) => users.findOne({ where: { id }, relations: { memberships: { studio: true } } }),
    setGlobalRole: (id: number, globalRole: GlobalRole | null) => users.update({ id }, { globalRole }),
    outbox: () =>
      mail.find({ select: { id: true, from: true, to: true, subject: true, receivedAt: true }, order: { id: 'DESC' }, take: 500 }),
    message: (id: number) => mail.findOneBy({ id }),
  };
}
