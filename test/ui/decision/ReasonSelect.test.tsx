/** Static rendering of the shared reason-code field. */
import { describe, expect, it } from 'vitest';
import { renderToStaticMarkup } from 'react-dom/server';
import { ReasonSelect } from '../../../src/ui/decision/ReasonSelect.tsx';
import { REASON_CODES } from '../../../src/core/review/vocabulary.ts';

describe('ReasonSelect', () => {
  it('offers (none) and every reason code of the team vocabulary, with the caller’s test hook and title', () => {
    const html = renderToStaticMarkup(<ReasonSelect reason="blink" onChoose={() => {}} testId="reason-select" title="Reason code" />);
    expect(html).toContain('data-testid="reason-select" title="Reason code"');
    expect(html.match(/<option/g)?.length).toBe(11); // (none) + the 10 reason codes of the team brief
    for (const r of REASON_CODES) expect(html).toContain(`<option value="${r}"`);
    expect(html).toMatch(/<option value="blink" selected="">blink<\/option>/);
  });
  it('selects (none) and shows no title when none is given', () => {
    const html = renderToStaticMarkup(<ReasonSelect reason={null} onChoose={() => {}} testId="decision-reason" />);
    expect(html).toContain('<option value="" selected="">(none)</option>');
    expect(html).not.toContain('title=');
  });
});

describe('ReasonSelect: a verdict/reason pair that contradicts itself is flagged, not refused', () => {
  it('flags keep + an artefact reason and remove + neural; mixed and unclear fit either verdict', () => {
    const keepBlink = renderToStaticMarkup(<ReasonSelect reason="blink" verdict="keep" onChoose={() => {}} testId="reason-select" />);
    expect(keepBlink).toContain('data-testid="reason-select-conflict"');
    expect(keepBlink).toContain('kept, but the reason “blink” names an artefact');
    expect(keepBlink).toMatch(/<option value="blink" selected="">/); // the choice stands
    expect(renderToStaticMarkup(<ReasonSelect reason="neural" verdict="remove" onChoose={() => {}} testId="r" />)).toContain('data-testid="r-conflict"');
    for (const [verdict, reason] of [['remove', 'blink'], ['keep', 'neural'], ['keep', 'mixed'], ['remove', 'unclear'], ['undecided', 'blink']] as const)
      expect(renderToStaticMarkup(<ReasonSelect reason={reason} verdict={verdict} onChoose={() => {}} testId="r" />)).not.toContain('conflict');
  });
});
