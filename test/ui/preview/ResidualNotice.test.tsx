import { describe, expect, it } from 'vitest';
import { renderToStaticMarkup } from 'react-dom/server';
import { ResidualNoticeBody } from '../../../src/ui/preview/ResidualNotice.tsx';
import type { ResidualResult } from '../../../src/core/review/residual.ts';

const measures = { ocular: null, mains: null, cardiac: null };

describe('ResidualNoticeBody', () => {
  it('lists each warning with its figures, marked by a symbol as well as words', () => {
    const result: ResidualResult = {
      measures,
      warnings: [
        { kind: 'ocular', text: 'Fp1 keeps 62 % of its slow activity that follows the vertical eye reference' },
        { kind: 'mains', text: '8 of 8 cleaned channels keep ≥ 5 % of their power at 50 Hz' },
      ],
    };
    const html = renderToStaticMarkup(<ResidualNoticeBody checking={false} failed={false} result={result} />);
    expect(html).toContain('▲ Artefact remains on the cleaned channels');
    expect(html).toContain('<li data-kind="ocular">Fp1 keeps 62 %');
    expect(html).toContain('<li data-kind="mains">8 of 8');
  });
  it('says when nothing remains, while checking, and when the check failed', () => {
    expect(renderToStaticMarkup(<ResidualNoticeBody checking={false} failed={false} result={{ measures, warnings: [] }} />)).toContain('No eye, mains or heartbeat artefact');
    expect(renderToStaticMarkup(<ResidualNoticeBody checking failed={false} result={null} />)).toContain('Checking');
    expect(renderToStaticMarkup(<ResidualNoticeBody checking={false} failed result={null} />)).toContain('could not be measured');
  });
});
