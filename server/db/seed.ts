// Demo data for local use: the fictional wineries "Quillwater Estate" and "Brambleford Cellars".
// Idempotent (fixed ids, insert-if-missing) and refuses to run against production.
import { eq } from 'drizzle-orm';
import type { Role } from '../../shared/permissions';
import { hashPassword } from '../lib/passwords';
import { createDatabase, type Database } from './client';
import { membershipsTable, usersTable, wineriesTable } from './schema';
import { seedCartridges } from './seeds/cartridges';
import { seedCellar } from './seeds/cellar';
import { seedEquipment } from './seeds/equipment';
import { seedPlans } from './seeds/plans';
import { seedRuns } from './seeds/runs';

export const DEMO_PASSWORD = 'porewise-demo';

export const demoWineries = {
  quillwater: { id: '6f1d3f0e-5b7a-4c1e-9a57-0c1a7e2b9d01', name: 'Quillwater Estate' },
  brambleford: { id: '6f1d3f0e-5b7a-4c1e-9a57-0c1a7e2b9d02', name: 'Brambleford Cellars' },
} as const;

export const demoPeople: { id: string; email: string; name: string; role: Role; winery: keyof typeof demoWineries }[] = [
  { id: 'demoowner0000001', email: 'owner@quillwater.test', name: 'Maren Quill', role: 'owner', winery: 'quillwater' },
  { id: 'democellar000001', email: 'cellar@quillwater.test', name: 'Teodor Vale', role: 'cellar-master', winery: 'quillwater' },
  { id: 'demowinemaker001', email: 'winemaker@quillwater.test', name: 'Ines Harrow', role: 'winemaker', winery: 'quillwater' },
  { id: 'demotech00000001', email: 'tech@quillwater.test', name: 'Sam Okafor', role: 'technician', winery: 'quillwater' },
  { id: 'demoauditor00001', email: 'auditor@quillwater.test', name: 'Priya Lund', role: 'auditor', winery: 'quillwater' },
  { id: 'demobramowner001', email: 'owner@brambleford.test', name: 'Jonah Bramble', role: 'owner', winery: 'brambleford' },
];

export async function seedDemo(db: Database) {
  const passwordHash = await hashPassword(DEMO_PASSWORD);
  await db.transaction(async (tx) => {
    for (const w of Object.values(demoWineries)) {
      await tx.insert(wineriesTable).values({ id: w.id, name: w.name }).onConflictDoNothing();
    }
    for (const p of demoPeople) {
      const wineryId = demoWineries[p.winery].id;
      const [existing] = await tx.select({ id: usersTable.id }).from(usersTable).where(eq(usersTable.email, p.email));
      const userId = existing?.id ?? p.id;
      if (!existing) {
        await tx.insert(usersTable).values({ id: p.id, email: p.email, name: p.name, passwordHash, activeWineryId: wineryId });
      }
      await tx.insert(membershipsTable).values({ wineryId, userId, role: p.role }).onConflictDoNothing();
    }
    // Quillwater gets a believable cellar; Brambleford stays small to show tenants apart.
    const ctx = { wineryId: demoWineries.quillwater.id, actorId: demoPeople[1].id };
    await seedEquipment(tx, ctx);
    await seedCellar(tx, ctx);
    await seedCartridges(tx, ctx);
    await seedPlans(tx, ctx);
    await seedRuns(tx, ctx);
  });
}

export async function runSeed(url: string) {
  if (process.env.NODE_ENV === 'production') throw new Error('The demo seed never runs in production.');
  const { db, pool } = createDatabase(url, { max: 2 });
  try {
    await seedDemo(db);
  } finally {
    await pool.end();
  }
}
