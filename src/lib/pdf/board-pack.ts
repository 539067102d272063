/** The board pack of a meeting as a PDF: one section per agenda item. */
import { formatDate } from '~/lib/format/dates';
import { budgetText, clockText, parcelFacts, pct, regionText, t, useText } from '../board/pack-words';
import type { ItemPack } from '../services/board-pack';
import { bullets, footers, heading, newPdf, para, parcelMap, riskLine, rows, MUTED, CLAY, type Pdf } from './document';

function itemSection(doc: Pdf, p: ItemPack, first: boolean): void {
  if (!first) doc.addPage();
  heading(doc, `Item ${p.item.position}: ${p.proposal.reference} — ${p.proposal.title}`, 15);
  para(doc, `Proposed: ${useText(p.proposal.proposed)}, from ${p.proposal.startYear}. Item ${p.item.status}.`);
  para(doc, `Statutory clock: ${clockText(p.clock)}`, {
    color: p.clock.state === 'overdue' || p.clock.state === 'near' ? CLAY : undefined,
  });

  heading(doc, 'Map of the parcels');
  parcelMap(
    doc,
    p.parcels.map((x) => x.geometry),
  );
  para(
    doc,
    `Outlines from the stored boundaries (WGS 84, drawn north up). ${p.parcels.length} ` +
      `parcel${p.parcels.length === 1 ? '' : 's'}, ${p.assessment.totals.areaHa.toFixed(2)} ha in all.`,
    { size: 8, color: MUTED },
  );

  heading(doc, 'Parcels');
  for (const x of p.parcels) {
    para(doc, x.reference, { size: 11 });
    rows(doc, parcelFacts(x));
  }

  heading(doc, `Figures (assessment ${p.assessment.number}, over 20 years)`);
  const tot = p.assessment.totals;
  rows(doc, [
    [
      'Net emission',
      `${t(tot.co2eTotal)}; 95 % range ${t(tot.co2eLow)} to ${t(tot.co2eHigh)} (${tot.runs.toLocaleString('en')} joint Monte Carlo runs)`,
    ],
    ['Soil carbon change', `${tot.socChangeTotal.toFixed(1)} t C`],
    ['Biomass carbon change', `${tot.biomassChangeTotal.toFixed(1)} t C`],
    ['N2O', `${tot.n2oTotal.toFixed(3)} t N2O (${p.assessment.gwp.toUpperCase()} GWP)`],
    ['Factor set', `${p.assessment.factorSet.id}, version ${p.assessment.factorSet.version}`],
  ]);

  heading(doc, 'Risk');
  riskLine(doc, p.risk.level);
  bullets(
    doc,
    p.risk.reasons.length
      ? p.risk.reasons.map((r) => `${r.text} (${r.citation}${r.gate ? '; a hard gate' : ''})`)
      : ['No rule of the set fired.'],
  );
  para(doc, `Rule set ${p.risk.ruleSet.id}, version ${p.risk.ruleSet.version}.`, { size: 8, color: MUTED });

  heading(doc, 'Alternatives');
  bullets(
    doc,
    p.alternatives.map(
      (a) =>
        `${a.label} (${a.areaHa.toFixed(2)} ha): ${
          a.available
            ? `${t(a.co2eTotal)}${a.co2eLow !== null ? `, 95 % range ${t(a.co2eLow)} to ${t(a.co2eHigh)}` : ''}${
                a.key !== 'proposal' && a.differenceFromProposal !== null
                  ? `; ${a.differenceFromProposal > 0 ? '+' : ''}${a.differenceFromProposal.toFixed(1)} t CO2e against the proposal`
                  : ''
              }`
            : 'not available'
        }${a.note ? `. ${a.note}` : ''}`,
    ),
    9,
  );

  heading(doc, 'Assessor’s findings');
  para(doc, p.assessment.findings || 'No findings written.');
  para(
    doc,
    `Signed off by ${p.assessment.signedBy ?? '—'}${p.assessment.signedAt ? ` on ${formatDate(p.assessment.signedAt)}` : ''}.`,
    { size: 8, color: MUTED },
  );

  heading(doc, 'Impact preview: if the board approves');
  bullets(doc, [
    ...(p.impact.regions.length
      ? p.impact.regions.map(regionText)
      : ['No accounting region recorded for these parcels: the ratio cannot be previewed.']),
    budgetText(p.impact.budget),
  ]);
  para(
    doc,
    `Figures as of today; the budget counts current approvals in the register for proposals starting ` +
      `in ${p.impact.budget.year}. Share of the budget after approval: ${pct(p.impact.budget.shareAfter)}.`,
    { size: 8, color: MUTED },
  );

  heading(doc, 'Cautions', 11);
  bullets(doc, p.cautions, 8);
}

export async function boardPackPdf(
  meeting: { id: number; date: string; place: string },
  packs: ItemPack[],
): Promise<Buffer> {
  const { doc, done } = newPdf({
    title: `Board pack, meeting of ${formatDate(meeting.date)}`,
    subject: `Board meeting ${meeting.id}, ${meeting.place}`,
  });
  heading(doc, `Board pack — meeting of ${formatDate(meeting.date)}`, 18);
  para(
    doc,
    `${meeting.place}. ${packs.length} item${packs.length === 1 ? '' : 's'} on the agenda. Board-internal: not for publication before the decision.`,
  );
  if (!packs.length) para(doc, 'The agenda is empty.');
  packs.forEach((p, i) => itemSection(doc, p, i === 0));
  footers(
    doc,
    `Swardkeep board pack, meeting of ${formatDate(meeting.date)}. Tier 1 estimates; not a substitute for survey; ` +
      `defer to local law and licensed professionals`,
  );
  doc.end();
  return done;
}
