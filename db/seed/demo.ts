import { sql } from 'kysely';
import type { Db } from '@/db/connect';
import type { ChainRole, LabelKind } from '@/db/types';
import { newCode } from '@/labels/code';
import { hashPassword } from '@/lib/auth/password';
import { assembleChain } from '@/lib/kits/chain';
import { checkKit } from '@/lib/electrical';
import { computeDueAt } from '@/lib/loans/due';
import { DEMO_PARTS, FERNWICK_SKUS } from './parts';
import { DEMO_PASSWORD, DEMO_PEOPLE } from './people';
import { seedRestock } from './restock';

type SpaceKey = 'quillmere' | 'fernwick';
const RULES: Record<SpaceKey, { closingTime: string; timeZone: string }> = {
  quillmere: { closingTime: '21:00', timeZone: 'America/Chicago' },
  fernwick: { closingTime: '18:00', timeZone: 'Europe/Berlin' },
};
const DAY = 86_400_000;

async function label(db: Db, spaceId: string, kind: LabelKind, targetId: string): Promise<string> {
  for (;;) {
    const code = newCode();
    const row = await db
      .insertInto('label_codes')
      .values({ code, space_id: spaceId, kind, target_id: targetId })
      .onConflict((oc) => oc.column('code').doNothing())
      .returning('code')
      .executeTakeFirst();
    if (row) return row.code;
  }
}

const TEMPLATES = [
  {
    name: 'Desk lamp, three LEDs',
    description: 'Three 3 W white LEDs on a heat-sink bar, a 350 mA buck driver and a 24 V wall supply.',
    cautions: 'Screw every star to the bar, thermal pad in place, before the first power-up: the bar is the heat sink. Use the wall supply from this box.',
    teaching:
      'Wire the string in series: driver LED+ to the first star’s +, each star’s − to the next star’s +, the last − back to the driver. ' +
      'Measure the string voltage with the meter while it runs, and compare with three times the forward voltage.',
    lines: [
      ['DRV-B350-36', 1, 'driver'],
      ['LED-3W-CW', 3, 'led'],
      ['HS-BAR-200', 1, null],
      ['PSU-24V-1A', 1, 'supply'],
      ['WIRE-TWIN-22', 1, 'wire'],
    ],
  },
  {
    name: 'Plant light, six reds',
    description: 'Six red LEDs at 700 mA on a heat-sink bar, fed from a 24 V 2 A supply.',
    cautions: 'At 700 mA the six reds make about 12 W of heat: keep all six on the bar and let it cool before packing the box.',
    teaching: 'Red LEDs have a lower forward voltage, so six of them fit under a 24 V supply with room to spare. Feel how warm the bar gets after ten minutes.',
    lines: [
      ['DRV-B700-30', 1, 'driver'],
      ['LED-3W-RD', 6, 'led'],
      ['HS-BAR-200', 1, null],
      ['PSU-24V-2A', 1, 'supply'],
      ['WIRE-TWIN-22', 1, 'wire'],
    ],
  },
  {
    name: 'Bench flood, eight whites',
    description: 'Eight 5 W white LEDs at 1 A from a 36 V supply: bright, and it needs real heat sinking.',
    cautions: 'About 26 W of light and heat: bolt the stars to both finned sinks before power, and never point the lamp at anyone.',
    teaching: 'At this power the heat sink matters more than anything else. Never run the LEDs without their sinks.',
    lines: [
      ['DRV-B1000-48', 1, 'driver'],
      ['LED-5W-CW', 8, 'led'],
      ['HS-FIN-60', 2, null],
      ['PSU-36V-2A', 1, 'supply'],
      ['WIRE-SIL-18R', 1, null],
    ],
  },
  {
    // The demo's heat lesson: the check says caution because one small sink carries four stars.
    name: 'Shelf light, four warm whites',
    description: 'Four 3 W warm white LEDs at 500 mA sharing one small round heat sink, a 500 mA buck driver and a 24 V wall supply.',
    cautions: 'One small round sink for four stars runs hot: the check asks for a sink of at most about 7.6 °C/W. Swap in the 60 mm finned sink from the shelf before a long run.',
    teaching: 'Run it for five minutes and touch the sink with the back of a finger: it gets hot. Then read the heat section of the check, and compare the sink it asks for with the finned sinks on the shelf.',
    lines: [
      ['DRV-B500-28', 1, 'driver'],
      ['LED-3W-WW', 4, 'led'],
      ['HS-RND-40', 1, null],
      ['PSU-24V-1A', 1, 'supply'],
      ['WIRE-TWIN-22', 1, 'wire'],
    ],
  },
] as const;

/** Seeds the two invented spaces; does nothing when any space exists already. */
export async function seedDemo(db: Db, clock: Date = new Date()): Promise<{ seeded: boolean }> {
  const existing = await db.selectFrom('spaces').select('id').limit(1).executeTakeFirst();
  if (existing) return { seeded: false };
  const passwordHash = await hashPassword(DEMO_PASSWORD);

  await db.transaction().execute(async (trx) => {
    const spaces = {
      quillmere: await trx
        .insertInto('spaces')
        .values({ slug: 'quillmere', name: 'Quillmere Makers', currency: 'USD', time_zone: RULES.quillmere.timeZone, loan_days: 14, closing_time: RULES.quillmere.closingTime, max_open_loans: 3 })
        .returning('id')
        .executeTakeFirstOrThrow(),
      fernwick: await trx
        .insertInto('spaces')
        .values({ slug: 'fernwick', name: 'Fernwick Institute Electronics Lab', currency: 'EUR', time_zone: RULES.fernwick.timeZone, loan_days: 7, closing_time: RULES.fernwick.closingTime, max_open_loans: 2 })
        .returning('id')
        .executeTakeFirstOrThrow(),
    };

    // How things change hands (lib/rules): Quillmere lets members help themselves; at Fernwick a steward
    // hands every borrow over at the bench and checks every return.
    await trx
      .updateTable('spaces')
      .set({ settings: JSON.stringify({ borrowing: { presence: 'bench_handover' } }) })
      .where('id', '=', spaces.fernwick.id)
      .execute();
    // Quillmere's money rules (lib/money-rules): an invented 6.5 % sales tax already inside its shelf
    // prices, and its own account codes per category, so the demo month's sales carry tax in the books.
    await trx
      .updateTable('spaces')
      .set({
        settings: JSON.stringify({
          borrowing: { presence: 'self_service' },
          money: { taxMode: 'inclusive', taxRateBp: 650, taxName: 'Sales tax', accountCodes: { consumable: '4100', wire: '4110', heat_sink: '4120', led: '4130' } },
        }),
      })
      .where('id', '=', spaces.quillmere.id)
      .execute();

    const userIds: Record<string, string> = {};
    for (const p of DEMO_PEOPLE) {
      const first = Object.keys(p.roles)[0] as SpaceKey;
      const u = await trx
        .insertInto('users')
        .values({ email: p.email, name: p.name, password_hash: passwordHash, last_space_id: spaces[first].id })
        .returning('id')
        .executeTakeFirstOrThrow();
      userIds[p.email] = u.id;
      for (const [key, roles] of Object.entries(p.roles)) {
        await trx.insertInto('memberships').values({ space_id: spaces[key as SpaceKey].id, user_id: u.id, roles: roles! }).execute();
      }
    }

    for (const key of ['quillmere', 'fernwick'] as const) {
      const spaceId = spaces[key].id;
      const steward = userIds[key === 'quillmere' ? 'tobiah@quillmere.example' : 'greta@fernwick.example'];
      const bins: Record<string, string> = {};
      for (const [binKey, name] of [
        ['drivers', 'Bin A1 · drivers'],
        ['leds', 'Bin A2 · LED stars'],
        ['supplies', 'Bin B1 · supplies'],
        ['consumables', 'Bin C1 · consumables'],
        ['tools', 'Shelf K · tools and kit boxes'],
      ] as const) {
        const loc = await trx
          .insertInto('locations')
          .values({ space_id: spaceId, name, kind: binKey === 'tools' ? 'shelf' : 'bin' })
          .returning('id')
          .executeTakeFirstOrThrow();
        const code = await label(trx, spaceId, 'location', loc.id);
        await trx.updateTable('locations').set({ code }).where('id', '=', loc.id).execute();
        bins[binKey] = loc.id;
      }

      const parts = key === 'quillmere' ? DEMO_PARTS : DEMO_PARTS.filter((p) => FERNWICK_SKUS.includes(p.sku));
      const partIds: Record<string, string> = {};
      const unitIds: Record<string, string[]> = {};
      for (const p of parts) {
        const sellable = p.priceMinor !== undefined;
        const row = await trx
          .insertInto('parts')
          .values({
            space_id: spaceId,
            sku: p.sku,
            name: p.name,
            category: p.category,
            tracking: p.tracking,
            specs: JSON.stringify(p.specs),
            sellable,
            lendable: p.category !== 'consumable',
            price_minor: p.priceMinor ?? null,
            sale_unit: p.saleUnit ?? 'each',
            reorder_point: p.reorder ?? 0,
          })
          .returning('id')
          .executeTakeFirstOrThrow();
        partIds[p.sku] = row.id;
        const partCode = await label(trx, spaceId, 'part', row.id);
        await trx.updateTable('parts').set({ code: partCode }).where('id', '=', row.id).execute();
        if (p.tracking === 'counted') {
          const qty = key === 'quillmere' ? (p.qty ?? 0) : Math.ceil((p.qty ?? 0) / 2);
          await trx.insertInto('stock').values({ space_id: spaceId, part_id: row.id, location_id: bins[p.bin], qty }).execute();
          await trx
            .insertInto('stock_movements')
            .values({ space_id: spaceId, part_id: row.id, location_id: bins[p.bin], qty_delta: qty, reason: 'receive', note: 'opening stock', actor_id: steward, created_at: new Date(clock.getTime() - 40 * DAY) })
            .execute();
        } else {
          unitIds[p.sku] = [];
          const n = key === 'quillmere' ? (p.units ?? 1) : Math.max(1, Math.ceil((p.units ?? 1) / 2));
          for (let i = 1; i <= n; i++) {
            const unitId = crypto.randomUUID();
            const code = await label(trx, spaceId, 'unit', unitId);
            await trx
              .insertInto('units')
              .values({ id: unitId, space_id: spaceId, part_id: row.id, code, serial: `${p.sku}-${String(i).padStart(2, '0')}`, location_id: bins[p.bin] })
              .execute();
            unitIds[p.sku].push(unitId);
          }
        }
      }

      // A driver with a flickering output waits for repair.
      const broken = unitIds['DRV-B700-30']?.at(-1);
      if (broken) {
        await trx.updateTable('units').set({ state: 'in_repair', notes: 'Output flickers above 20 V in; check the sense resistor joint.' }).where('id', '=', broken).execute();
        await trx.insertInto('stock_movements').values({ space_id: spaceId, part_id: partIds['DRV-B700-30'], unit_id: broken, qty_delta: 0, reason: 'repair', note: 'flickers', actor_id: steward }).execute();
      }

      // Suppliers, offers, a budget and two order lists (issue 13), at Quillmere.
      if (key === 'quillmere') await seedRestock(trx, spaceId, partIds, bins, steward, clock);

      // Kit templates and boxes built from labelled units and counted stock.
      const templates = key === 'quillmere' ? TEMPLATES : TEMPLATES.slice(0, 1);
      const boxes: { id: string; name: string; template: string }[] = [];
      for (const t of templates) {
        const tpl = await trx
          .insertInto('kit_templates')
          .values({ space_id: spaceId, name: t.name, description: t.description, teaching_notes: t.teaching, cautions: t.cautions })
          .returning('id')
          .executeTakeFirstOrThrow();
        for (const [i, [sku, qty, role]] of t.lines.entries()) {
          await trx.insertInto('kit_template_lines').values({ space_id: spaceId, template_id: tpl.id, part_id: partIds[sku], qty, chain_role: role as ChainRole | null, position: i }).execute();
        }
        const boxCount = t.name.startsWith('Desk') ? 2 : 1;
        for (let b = 1; b <= boxCount; b++) {
          const boxId = crypto.randomUUID();
          const code = await label(trx, spaceId, 'kit_box', boxId);
          const name = `${t.name.split(',')[0]} box ${b}`;
          await trx.insertInto('kit_boxes').values({ id: boxId, space_id: spaceId, template_id: tpl.id, code, name, location_id: bins.tools }).execute();
          for (const [sku, qty, role] of t.lines) {
            const part = parts.find((p) => p.sku === sku)!;
            if (part.tracking === 'unit') {
              const unitId = await takeFreeUnit(trx, partIds[sku]);
              await trx.updateTable('units').set({ kit_box_id: boxId, location_id: null }).where('id', '=', unitId).execute();
              await trx.insertInto('kit_box_contents').values({ space_id: spaceId, kit_box_id: boxId, part_id: partIds[sku], unit_id: unitId, qty: 1, chain_role: role as ChainRole | null }).execute();
            } else {
              await trx.updateTable('stock').set((eb) => ({ qty: eb('qty', '-', qty) })).where('part_id', '=', partIds[sku]).where('location_id', '=', bins[part.bin]).execute();
              await trx.insertInto('stock_movements').values({ space_id: spaceId, part_id: partIds[sku], location_id: bins[part.bin], qty_delta: -qty, reason: 'kit_build', ref_type: 'kit_box', ref_id: boxId, actor_id: steward }).execute();
              await trx.insertInto('kit_box_contents').values({ space_id: spaceId, kit_box_id: boxId, part_id: partIds[sku], qty, chain_role: role as ChainRole | null }).execute();
            }
          }
          boxes.push({ id: boxId, name, template: t.name });
        }
      }

      // Inductions in each space's own words. Quillmere asks for its heat-sink induction before the shelf
      // light kit (the hot one) goes out, and Juniper has been signed off for a year; Fernwick keeps a walk-through.
      const inductionPlan =
        key === 'quillmere'
          ? [
              {
                name: 'Hot heat sinks',
                description: 'Where a running lamp gets hot, holding it by the bracket only, and letting the sink cool before packing the box.',
                template: 'Shelf light, four warm whites',
                signed: 'juniper@quillmere.example',
              },
              { name: 'Soldering at the bench', description: 'Iron stand, fume fan on, tip cleaned and tinned, iron off when you leave.', template: null, signed: 'cassius@quillmere.example' },
            ]
          : [{ name: 'Lab walk-through', description: 'Where the isolator switch, the first-aid kit and the spill tray are.', template: null, signed: 'mirela@fernwick.example' }];
      for (const ind of inductionPlan) {
        const row = await trx.insertInto('inductions').values({ space_id: spaceId, name: ind.name, description: ind.description }).returning('id').executeTakeFirstOrThrow();
        if (ind.template) {
          const tpl = await trx.selectFrom('kit_templates').select('id').where('space_id', '=', spaceId).where('name', '=', ind.template).executeTakeFirstOrThrow();
          await trx.insertInto('kit_template_inductions').values({ space_id: spaceId, template_id: tpl.id, induction_id: row.id }).execute();
        }
        await trx
          .insertInto('induction_signoffs')
          .values({ space_id: spaceId, induction_id: row.id, user_id: userIds[ind.signed], signed_by: steward, signed_at: new Date(clock.getTime() - 30 * DAY), expires_at: new Date(clock.getTime() + 335 * DAY), note: 'Shown at the bench.' })
          .execute();
      }

      // Loans: one out and due soon, one overdue (Quillmere); one out in Fernwick.
      const loanPlan =
        key === 'quillmere'
          ? [
              { box: 'Desk lamp box 1', who: 'juniper@quillmere.example', outDaysAgo: 9, dueInDays: 5 },
              { box: 'Plant light box 1', who: 'cassius@quillmere.example', outDaysAgo: 18, dueInDays: -4 },
            ]
          : [{ box: 'Desk lamp box 1', who: 'rosalind@emberquist.example', outDaysAgo: 2, dueInDays: 5 }];
      for (const plan of loanPlan) {
        const box = boxes.find((b) => b.name === plan.box)!;
        const contents = await trx
          .selectFrom('kit_box_contents')
          .innerJoin('parts', 'parts.id', 'kit_box_contents.part_id')
          .select(['kit_box_contents.part_id', 'kit_box_contents.unit_id', 'kit_box_contents.qty', 'kit_box_contents.chain_role', 'parts.category', 'parts.name', 'parts.specs'])
          .where('kit_box_id', '=', box.id)
          .execute();
        const chain = assembleChain(contents.map((c) => ({ role: c.chain_role, category: c.category, name: c.name, qty: c.qty, specs: c.specs })));
        const report = chain.ok ? checkKit(chain.spec) : null;
        const loan = await trx
          .insertInto('loans')
          .values({
            space_id: spaceId,
            borrower_id: userIds[plan.who],
            lent_by_id: steward,
            kit_box_id: box.id,
            out_at: new Date(clock.getTime() - plan.outDaysAgo * DAY),
            // Due at the space's closing time, local, as a real loan would be.
            due_at: computeDueAt(new Date(clock.getTime() - plan.outDaysAgo * DAY), {
              loanDays: plan.outDaysAgo + plan.dueInDays,
              ...RULES[key],
            }),
            check_verdict: report?.verdict ?? null,
            check_report: report ? JSON.stringify({ spec: chain.ok ? chain.spec : null, report }) : null,
            caution_acknowledged: report?.verdict === 'caution',
            created_at: new Date(clock.getTime() - plan.outDaysAgo * DAY),
          })
          .returning('id')
          .executeTakeFirstOrThrow();
        for (const c of contents) {
          await trx.insertInto('loan_lines').values({ loan_id: loan.id, space_id: spaceId, part_id: c.part_id, unit_id: c.unit_id, qty: c.qty, chain_role: c.chain_role }).execute();
          if (c.unit_id) await trx.updateTable('units').set({ state: 'out' }).where('id', '=', c.unit_id).execute();
        }
        await trx.updateTable('kit_boxes').set({ state: 'out' }).where('id', '=', box.id).execute();
        await trx
          .insertInto('audit_log')
          .values({ space_id: spaceId, actor_id: steward, action: 'loan.created', target_type: 'loan', target_id: loan.id, detail: JSON.stringify({ box: box.name, verdict: report?.verdict }) })
          .execute();
      }
    }
    await sql`select 1`.execute(trx);
  });
  return { seeded: true };
}

async function takeFreeUnit(db: Db, partId: string): Promise<string> {
  const u = await db
    .selectFrom('units')
    .select('id')
    .where('part_id', '=', partId)
    .where('state', '=', 'on_shelf')
    .where('kit_box_id', 'is', null)
    .orderBy('serial')
    .limit(1)
    .executeTakeFirst();
  if (!u) throw new Error(`seed: no free unit of part ${partId}`);
  return u.id;
}
