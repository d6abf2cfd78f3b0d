import { describe, expect, it } from 'vitest';
import { checkSources } from '../../src/check/run-checks.ts';
import { renderBodyHtml } from '../../src/render/body-html.ts';
import { buildManualView, reviewMark, slugOf, statusBanner, withoutDrawnParts } from '../../src/render/manual.ts';
import { mentionsTag } from '../../src/render/where-used.ts';
import { readTestProcedure, procedureText } from './procedure-text.ts';

describe('review marks and status banners', () => {
  it('marks a review date before the build date as overdue, within 30 days as due soon', () => {
    expect(reviewMark({ reviewBy: '2026-01-31', status: 'effective' }, '2026-02-01').state).toBe('overdue');
    expect(reviewMark({ reviewBy: '2026-02-01', status: 'effective' }, '2026-02-01').state).toBe('due-soon');
    expect(reviewMark({ reviewBy: '2026-03-03', status: 'effective' }, '2026-02-01').state).toBe('due-soon');
    expect(reviewMark({ reviewBy: '2026-03-04', status: 'effective' }, '2026-02-01').state).toBe('ok');
    expect(reviewMark({ reviewBy: '2020-01-01', status: 'retired' }, '2026-02-01').state).toBe('none');
  });

  it('shows a banner for every status that must not be used yet or any more', () => {
    for (const status of ['draft', 'in-review', 'superseded', 'retired']) expect(statusBanner({ status }, '2026-01-01')).toBeDefined();
    expect(statusBanner({ status: 'superseded' }, '2026-01-01')?.tone).toBe('stop');
    expect(statusBanner({ status: 'effective', effective: '2025-01-01' }, '2026-01-01')).toBeUndefined();
    expect(statusBanner({ status: 'approved', effective: '2026-06-01' }, '2026-01-01')?.title).toContain('NOT YET EFFECTIVE');
  });

  it('does not claim a newer revision replaces a superseded procedure: the format does not say what replaced it', () => {
    const banner = statusBanner({ status: 'superseded', owner: 'Unit 2 Operations, Blending' }, '2026-01-01')!;
    expect(banner.title).toBe('SUPERSEDED — DO NOT USE');
    expect(banner.text).toContain('This procedure is superseded and must not be used.');
    expect(banner.text).not.toMatch(/newer revision|current revision/i);
    expect(banner.text).toContain('ask the procedure owner (Unit 2 Operations, Blending)');
    // No link is made up: the manual knows no replacing page.
    expect(banner.link).toBeUndefined();
    expect(statusBanner({ status: 'superseded' }, '2026-01-01')!.text).toContain('ask the procedure owner for');
  });

  it('says a retired procedure must not be used, without pointing at a replacement', () => {
    const banner = statusBanner({ status: 'retired' }, '2026-01-01')!;
    expect(banner.title).toBe('RETIRED — DO NOT USE');
    expect(banner.text).toContain('must not be used');
    expect(banner.text).not.toMatch(/newer revision|replace/i);
    expect(banner.link).toBeUndefined();
  });
});

describe('manual view', () => {
  const a = procedureText({
    id: 'U9-A-001', title: 'Start pump P-1', kind: 'startup', status: 'effective', revision: 2, effective: '2025-01-01', 'review-by': '2025-06-01',
    equipment: ['P-1', 'V-2'],
    signals: { 'TI-1': { text: 'Temperature', unit: 'degC', range: [0, 200] } },
    limits: { 'TI-1': { low: '10 degC', high: '90 degC', consequence: 'Seal damage', correction: 'Cool' } },
    interlocks: [{ tag: 'TSH-1', 'trips-when': 'TI-1 >= 120 degC', action: 'Stops P-1' }],
    hazards: [
      { level: 'notice', hazard: 'Seal wear', at: ['start'] },
      { level: 'danger', hazard: 'Hot liquid', at: ['heat'] },
      { level: 'warning', hazard: 'Noise', at: [] },
    ],
    steps: [
      { step: 'start', do: 'Start pump P-1', until: 'done' },
      { step: 'heat', do: 'Heat the loop', set: { 'TI-1': '80 degC' }, until: 'TI-1 >= 78 degC' },
    ],
  }, '## Purpose\n\nMoves <b>water</b>.\n\n<script>alert(1)</script>\n');
  const b = procedureText({ id: 'U9-B-001', title: 'Old way', kind: 'shutdown', status: 'superseded', revision: 1, equipment: ['P-1'], steps: [{ step: 'stop', do: 'Stop P-1', until: 'done' }] });
  const result = checkSources([{ file: 'procedures/pumps/a.md', text: a }, { file: 'procedures/b.md', text: b }], { today: '2026-01-01' });
  const view = buildManualView({ files: result.files, root: 'procedures', today: '2026-01-01' });
  const pa = view.procedures.find((p) => p.id === 'U9-A-001')!;

  it('groups procedures by area and kind, with area names people read rather than folder names', () => {
    expect(view.areas.map((x) => [x.area, x.id])).toEqual([['General', '_top_level_'], ['Pumps', 'pumps']]);
    expect(view.areas[1].kinds.map((k) => k.label)).toEqual(['Start-up']);
  });

  it('orders hazards DANGER > WARNING > CAUTION > NOTICE and links their steps', () => {
    expect(pa.hazards.map((h) => h.word)).toEqual(['DANGER', 'WARNING', 'NOTICE']);
    expect(pa.hazards[0].steps).toEqual([{ id: 'heat', number: '2' }]);
  });

  it('lists limits with the unit once', () => {
    expect(pa.limits[0]).toMatchObject({ signal: 'TI-1', low: '10', high: '90', unit: 'degC', consequence: 'Seal damage', correction: 'Cool' });
  });

  it('keeps the yearly certifications apart from the approvals, newest first', () => {
    // Source: OSHA 29 CFR 1910.119(f)(3): the employer certifies annually that the procedures are current and accurate.
    const certified = procedureText({
      id: 'U9-C-001', title: 'Drain V-2', kind: 'normal', status: 'effective', revision: 1, effective: '2025-01-01', 'review-by': '2026-11-02',
      certifications: [{ name: 'C. Older', role: 'Superintendent', date: '2025-10-01' }, { name: 'C. Newer', role: 'Superintendent', date: '2025-11-02' }],
      steps: [{ step: 'drain', do: 'Drain V-2', until: 'done' }],
    });
    const checked = checkSources([{ file: 'procedures/c.md', text: certified }], { today: '2026-01-01' });
    const pc = buildManualView({ files: checked.files, root: 'procedures', today: '2026-01-01' }).procedures[0];
    expect(pc.certifications).toEqual([{ name: 'C. Newer', role: 'Superintendent', date: '2025-11-02' }, { name: 'C. Older', role: 'Superintendent', date: '2025-10-01' }]);
    expect(pc.approvals.map((x) => x.name)).not.toContain('C. Newer');
    expect(pa.certifications).toEqual([]);
  });

  it('marks overdue review, and the superseded procedure as not current with a banner', () => {
    expect(pa.review.state).toBe('overdue');
    const pb = view.procedures.find((p) => p.id === 'U9-B-001')!;
    expect(pb.current).toBe(false);
    expect(pb.banner?.title).toContain('SUPERSEDED');
    expect(pa.url).toBe('/procedures/u9-a-001/');
  });

  it('builds where-used: tag → procedures → steps', () => {
    const p1 = view.tags.find((t) => t.tag === 'P-1')!;
    expect(p1.uses.map((u) => [u.procedureId, u.steps.map((s) => s.id)])).toEqual([['U9-A-001', ['start']], ['U9-B-001', ['stop']]]);
    const tsh = view.tags.find((t) => t.tag === 'TSH-1')!;
    expect(tsh.roles).toEqual(['interlock']);
    // The interlock watches TI-1; the step that sets TI-1 is where it matters.
    expect(tsh.uses[0].steps.map((s) => s.id)).toEqual(['heat']);
  });

  it('renders the narrative without raw HTML', () => {
    expect(pa.bodyHtml).toContain('<h3>Purpose</h3>');
    expect(pa.bodyHtml).not.toContain('<script');
    expect(pa.bodyHtml).not.toContain('<b>');
  });

  it('makes the step table, the body and the lead when a page first reads them, once, and keys pages without them', () => {
    const fresh = buildManualView({ files: result.files, root: 'procedures', today: '2026-01-01' }).procedures.find((p) => p.id === 'U9-A-001')!;
    const eager = withoutDrawnParts(fresh);
    expect(eager).not.toHaveProperty('rows');
    expect(eager).not.toHaveProperty('bodyHtml');
    expect(eager).not.toHaveProperty('lead');
    expect(eager).toMatchObject({ id: 'U9-A-001', stepCount: 2, hazards: pa.hazards });
    // Read on demand, they are the same as the view read in full, and kept.
    expect(fresh.rows).toEqual(pa.rows);
    expect(fresh.rows).toBe(fresh.rows);
    expect(fresh.rows.flatMap((r) => (r.kind === 'step' ? [r.number] : []))).toEqual(['1', '2']);
    expect(fresh.bodyHtml).toBe(pa.bodyHtml);
    expect(fresh.lead).toBeUndefined();
  });
});

describe('safe narrative HTML', () => {
  it('drops raw HTML and dangerous links', () => {
    const p = readTestProcedure({ steps: [] }, 'Text [x](javascript:alert(1)) <img src=x onerror=alert(1)>\n\n<div onclick="x()">hi</div>\n');
    const html = renderBodyHtml(p.body);
    expect(html).not.toMatch(/javascript:|onerror|onclick|<img|<div/);
    expect(html).toContain('Text');
  });
});

describe('tags and slugs', () => {
  it('matches tags as whole tokens', () => {
    expect(mentionsTag('Start pump P-1 now', 'P-1')).toBe(true);
    expect(mentionsTag('Start pump P-10 now', 'P-1')).toBe(false);
    expect(mentionsTag('Open XP-1', 'P-1')).toBe(false);
    expect(mentionsTag('TI-210 >= 5 degC', 'TI-210')).toBe(true);
  });

  it('makes lower-case, path-safe slugs', () => {
    expect(slugOf('U2-K210-BATCH-001')).toBe('u2-k210-batch-001');
    expect(slugOf('../etc/passwd')).toBe('__etc_passwd');
    expect(slugOf('A B/C')).toBe('a_b_c');
  });
});

describe('where-used of decision signals', () => {
  it('names the step that waits for the decision', () => {
    const text = procedureText({
      id: 'U9-C-001', signals: { 'lab-ok': { text: 'Lab release', values: ['pass', 'fail'] } },
      steps: [
        { step: 'sample', do: 'Take a sample', confirm: 'Sample taken' },
        { step: 'await-lab', do: 'Wait for the lab' },
        { choose: [{ when: 'lab-ok == pass', steps: [{ step: 'ship', do: 'Ship it', until: 'done' }] }, { when: 'lab-ok == fail', goto: 'sample' }] },
      ],
    });
    const result = checkSources([{ file: 'procedures/c.md', text }], { today: '2026-01-01' });
    const view = buildManualView({ files: result.files, root: 'procedures', today: '2026-01-01' });
    expect(view.tags.find((t) => t.tag === 'lab-ok')!.uses[0].steps.map((s) => s.id)).toEqual(['await-lab']);
  });
});
