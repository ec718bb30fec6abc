import type { DataSource } from 'typeorm';
import { hashPassword } from '../server/modules/auth/password.ts';
import { recordAudit } from '../server/modules/audit/audit.service.ts';
import { User } from '../server/modules/users/user.entity.ts';
import { seedDemoCatalog } from './demo-catalog.ts';
import { seedDemoHistory } from './demo-history.ts';
import { seedDemoStock } from './demo-stock.ts';
import { DEMO_PASSWORD, DEMO_USERS } from './demo-users.ts';

/**
 * Loads the invented demo scenario. Idempotent: each row is created only when missing, so a
 * second start changes nothing.
 */
export async function seedDemo(ds: DataSource, log: (l: string) => void = () => {}): Promise<{ created: number }> {
  let created = 0;
  const hash = await hashPassword(DEMO_PASSWORD);
  await ds.transaction(async (m) => {
    for (const u of DEMO_USERS) {
      if (await m.findOneBy(User, { email: u.email })) continue;
      const saved = await m.save(m.create(User, { ...u, passwordHash: hash, active: true }));
      await recordAudit(m, {
        actor: null,
        action: 'user.create',
        entityType: 'user',
        entityId: saved.id,
        after: { email: u.email, name: u.name, role: u.role, active: true },
        note: 'demo scenario',
      });
      created++;
    }
  });
  if (created) log(`Demo scenario: created ${created} demo users.`);
  created += await seedDemoCatalog(ds, log);
  created += await seedDemoHistory(ds, log);
  created += await seedDemoStock(ds, log);
  return { created };
}
