/** The decision notice of a register entry as a PDF: only the public register content. */
import { formatDate } from '~/lib/format/dates';
import { ENTRY_KIND_LABELS, OUTCOME_LABELS, type RegisterContent } from '../register/content';
import { STANDARD_CAUTIONS } from '../carbon/cautions';
import { t } from '../board/pack-words';
import { bullets, footers, heading, newPdf, para, parcelMap, riskLine, rows, MUTED } from './document';

type Entry = {
  seq: number;
  hash: string;
  prevHash: string;
  supersedesSeq: number | null;
  supersededBy: number | null;
  content: RegisterContent;
  headSeq: number;
  headHash: string | null;
};

export async function decisionNoticePdf(e: Entry): Promise<Buffer> {
  const c = e.content;
  const { doc, done } = newPdf({
    title: `Decision notice, register entry ${e.seq}`,
    subject: `${c.proposal.reference} ${OUTCOME_LABELS[c.outcome]}`,
  });
  heading(doc, `Decision notice — register entry ${e.seq}`, 18);
  para(doc, `${ENTRY_KIND_LABELS[c.kind]}: ${c.proposal.reference} — ${c.proposal.title}`, { size: 12 });
  if (e.supersededBy) para(doc, `This entry has been replaced by entry ${e.supersededBy}.`);
  if (e.supersedesSeq) para(doc, `This entry replaces entry ${e.supersedesSeq}. ${c.note ?? ''}`);
  rows(doc, [
    ['Outcome', OUTCOME_LABELS[c.outcome]],
    [
      'Decided',
      `${formatDate(c.decidedOn)}${c.meeting ? `, board meeting of ${formatDate(c.meeting.date)} (${c.meeting.place})` : ''}`,
    ],
    ['Effective', formatDate(c.effectiveDate)],
    ['Appeal until', formatDate(c.appealUntil)],
    ['Proposed use', `${c.proposal.proposedUse}, from ${c.proposal.startYear}`],
    ['Area', `${c.areaHa.toFixed(2)} ha${c.region ? `, region ${c.region}` : ''}`],
    ['Parcels', c.parcels.map((p) => `${p.reference} (${p.areaHa.toFixed(2)} ha${p.part ? ', part' : ''})`).join(', ')],
    [
      'Emissions',
      `${t(c.figures.co2eTotal)} (95 % range ${t(c.figures.co2eLow)} ` +
        `to ${t(c.figures.co2eHigh)}; ${c.figures.gwp.toUpperCase()} GWP; ${c.figures.runs.toLocaleString('en')} joint runs)`,
    ],
    ['Soil carbon', `${c.figures.socChangeTotal.toFixed(1)} t C over the transition period`],
    [
      'Factors, rules',
      `${c.factorSet.id} version ${c.factorSet.version}; ${c.ruleSet ? `${c.ruleSet.id} version ${c.ruleSet.version}` : 'no rule set'}`,
    ],
    ...(c.votes
      ? [
          [
            'Votes',
            `${c.votes.approve} approve, ${c.votes.approveWithConditions} with conditions, ${c.votes.refuse} ` +
              `refuse, ${c.votes.defer} defer, ${c.votes.abstain} abstain; ${c.votes.declaredConflicts} declared a conflict`,
          ] as [string, string],
        ]
      : []),
  ]);
  heading(doc, 'Risk');
  riskLine(doc, c.risk.level);
  heading(doc, 'Map');
  parcelMap(
    doc,
    c.parcels.map((p) => p.geometry),
    200,
  );
  heading(doc, 'Reasons');
  para(doc, c.reasons);
  if (c.conditions.length) {
    heading(doc, 'Conditions');
    c.conditions.forEach((x, i) =>
      para(doc, `${i + 1}. ${x.text} Due ${formatDate(x.dueDate)}; checked by ${x.checkedBy}.`),
    );
  }
  heading(doc, 'Hashes', 11);
  para(doc, `Entry hash: ${e.hash}`, { size: 8 });
  para(doc, `Previous entry's hash: ${e.prevHash}`, { size: 8 });
  para(doc, `Register head when this notice was made: entry ${e.headSeq}, hash ${e.headHash ?? '—'}`, { size: 8 });
  para(
    doc,
    'The hash is the SHA-256 of the RFC 8785 canonical JSON of the entry content, the previous hash and its number; /api/register/verify recomputes the chain.',
    { size: 8, color: MUTED },
  );
  heading(doc, 'Cautions', 11);
  bullets(doc, [...STANDARD_CAUTIONS], 8);
  footers(doc, `Swardkeep public register, entry ${e.seq}`);
  doc.end();
  return done;
}
