/**
 * Changes one rule of a draft: its threshold values, level, gate, citation and explanation, with
 * a required reason. Sends the draft revision the page was drawn from; a stale one gets 409.
 */
import type { Rule } from '~/lib/rules/schema';
import { ActionForm } from '../factor-sets/ActionForm';

type ParamValue = number | boolean | string | string[];

function paramInput(name: string, value: ParamValue) {
  const id = `p-${name}`;
  if (typeof value === 'boolean') {
    return (
      <label key={name} className="flex items-center gap-2 text-sm">
        <input type="checkbox" name={id} defaultChecked={value} /> {name}
      </label>
    );
  }
  return (
    <label key={name} className="field">
      <span>
        {name}
        {Array.isArray(value) ? ' (comma-separated)' : ''}
      </span>
      <input
        name={id}
        className="input"
        type={typeof value === 'number' ? 'number' : 'text'}
        step={typeof value === 'number' ? 'any' : undefined}
        defaultValue={Array.isArray(value) ? value.join(', ') : String(value)}
        required
      />
    </label>
  );
}

function readParams(f: FormData, params: Record<string, ParamValue>): Record<string, ParamValue> {
  return Object.fromEntries(
    Object.entries(params).map(([k, v]) => {
      const raw = f.get(`p-${k}`);
      if (typeof v === 'boolean') return [k, raw === 'on'];
      if (typeof v === 'number') return [k, Number(raw)];
      if (Array.isArray(v))
        return [
          k,
          String(raw ?? '')
            .split(',')
            .map((x) => x.trim())
            .filter(Boolean),
        ];
      return [k, String(raw ?? '')];
    }),
  );
}

export function RuleEditor({ setId, revision, rule }: { setId: string; revision: number; rule: Rule }) {
  const s = (f: FormData, k: string) => String(f.get(k) ?? '');
  const params = rule.params as Record<string, ParamValue>;
  return (
    <details className="mt-3">
      <summary className="cursor-pointer text-sm">Change this rule</summary>
      <ActionForm
        label="Save the change to the draft"
        method="PATCH"
        url={`/api/rule-sets/${setId}/draft`}
        next="reload"
        className="mt-2 grid gap-3 md:grid-cols-2"
        body={(f) => ({
          action: 'put',
          ruleId: rule.id,
          revision,
          reason: s(f, 'reason'),
          rule: {
            ...rule,
            title: s(f, 'title'),
            level: Number(s(f, 'level')),
            gate: f.get('gate') === 'on',
            params: readParams(f, params),
            citation: { source: s(f, 'source'), article: s(f, 'article') },
            explanation: s(f, 'explanation'),
            thresholdSource: s(f, 'thresholdSource'),
          },
        })}
      >
        <label className="field md:col-span-2">
          <span>Title</span>
          <input name="title" className="input" defaultValue={rule.title} required />
        </label>
        {Object.entries(params).map(([k, v]) => paramInput(k, v))}
        <label className="field">
          <span>Level it gives</span>
          <select name="level" className="input" defaultValue={rule.level}>
            <option value={2}>2</option>
            <option value={3}>3</option>
            <option value={4}>4</option>
          </select>
        </label>
        <label className="flex items-center gap-2 text-sm">
          <input type="checkbox" name="gate" defaultChecked={rule.gate} /> Hard gate (sets level 4 whatever else holds)
        </label>
        <label className="field">
          <span>Law or guidance</span>
          <input name="source" className="input" defaultValue={rule.citation.source} required />
        </label>
        <label className="field">
          <span>Article</span>
          <input name="article" className="input" defaultValue={rule.citation.article} required />
        </label>
        <label className="field md:col-span-2">
          <span>Explanation in plain words</span>
          <textarea name="explanation" className="input" rows={2} defaultValue={rule.explanation} required />
        </label>
        <label className="field md:col-span-2">
          <span>Where the threshold comes from</span>
          <input name="thresholdSource" className="input" defaultValue={rule.thresholdSource} required />
        </label>
        <label className="field md:col-span-2">
          <span>Reason for the change and its source (recorded with the edit)</span>
          <textarea name="reason" className="input" rows={2} required />
        </label>
      </ActionForm>
      <ActionForm
        quiet
        label="Remove this rule from the draft"
        method="PATCH"
        url={`/api/rule-sets/${setId}/draft`}
        next="reload"
        className="mt-3 flex flex-col gap-2"
        body={(f) => ({ action: 'remove', ruleId: rule.id, revision, reason: s(f, 'removeReason') })}
      >
        <label className="field">
          <span>Reason for removing it</span>
          <input name="removeReason" className="input" required />
        </label>
      </ActionForm>
    </details>
  );
}
