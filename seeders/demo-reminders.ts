// Demo reminder campaigns for the coming season (2027) at the invented dealership in north-central
// Kansas. Planting windows come from the published defaults (Kansas corn opens Apr 15, soybean
// May 15: USDA-NASS Agricultural Handbook 628 via K-State). On the demo's date, Dec 1, 2026:
//   - "Early-order reminder" (140 days before corn, due since Nov 26) is a draft: pressing Run
//     sends it at once to every opted-in corn grower, and the messages show on Sent mail;
//   - the corn check-up campaign (60, 30, 10 days: Feb 14, Mar 16, Apr 5) and the soybean one
//     (45 and 15 days: Mar 31, Apr 30) are active and go out by themselves on those days.
import type { Sequelize } from 'sequelize';
import { ReminderCampaign, ReminderCampaignTerritory, Territory, User } from '../server/db/models/index.js';

const CHECKUP_BODY = `Hello {{grower.firstName}},

Corn planting around here opens about {{windowStart}}, {{daysBefore}} days from now. Before the shop fills up, let's get the planters at {{account.name}} through their pre-season check-up.

On record for you:

{{planters}}

Planned for {{season}}:

{{roadmapItems}}

At the check-up we go through:

{{checklist}}

Pick a time that suits you:

{{bookingLink}}

{{specialist.name}}
{{specialist.email}}`;

const EARLY_ORDER_BODY = `Hello {{grower.firstName}},

Early orders for the {{season}} season are open now. Ordering before the rush means the parts are on the shelf and fitted well before corn planting opens around {{windowStart}}.

What we have planned for {{account.name}} this season:

{{roadmapItems}}

Want to go over it together, or have the planters looked at while we are out? Ask for a visit:

{{bookingLink}}

{{specialist.name}}
{{specialist.email}}`;

const SOY_BODY = `Hello {{grower.firstName}},

Soybean planting opens around {{windowStart}}. If your planters switch from corn to soybeans, now is a good moment to check the meters and population settings for beans.

{{checklist}}

Ask for a visit:

{{bookingLink}}

{{specialist.name}}`;

export async function seedDemoReminders(sequelize: Sequelize) {
  await sequelize.transaction(async (transaction) => {
    const territories = await Territory.findAll({ transaction, order: [['id', 'ASC']] });
    if (!territories.length) return;
    const admin = await User.findOne({ where: { role: 'admin' }, order: [['id', 'ASC']], transaction });
    const campaigns = [
      {
        name: 'Early-order reminder — 2027 season',
        crop: 'corn',
        offsetsDays: [140],
        audience: { growsCrop: true, hasRoadmapItems: false, noCheckupSince: null },
        subject: 'Early orders for {{season}} are open, {{grower.firstName}}',
        body: EARLY_ORDER_BODY,
        status: 'draft' as const,
      },
      {
        name: 'Pre-season check-up — corn 2027',
        crop: 'corn',
        offsetsDays: [60, 30, 10],
        // Growers already seen since the last harvest need no reminder.
        audience: { growsCrop: true, hasRoadmapItems: false, noCheckupSince: '2026-09-01' },
        subject: '{{grower.firstName}}, time to book your planter check-up',
        body: CHECKUP_BODY,
        status: 'active' as const,
      },
      {
        name: 'Soybean set-up check — 2027',
        crop: 'soybean',
        offsetsDays: [45, 15],
        audience: { growsCrop: true, hasRoadmapItems: false, noCheckupSince: null },
        subject: 'Getting the planters ready for soybeans, {{grower.firstName}}',
        body: SOY_BODY,
        status: 'active' as const,
      },
    ];
    for (const c of campaigns) {
      if (await ReminderCampaign.findOne({ where: { name: c.name, season: 2027 }, transaction })) continue;
      const created = await ReminderCampaign.create({ ...c, season: 2027, regionKey: 'ks-north-central', createdBy: admin?.id ?? null, updatedBy: admin?.id ?? null }, { transaction });
      await ReminderCampaignTerritory.bulkCreate(territories.map((t) => ({ campaignId: created.id, territoryId: t.id })), { transaction });
    }
  });
}
