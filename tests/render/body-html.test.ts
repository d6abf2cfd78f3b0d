// The narrative body as HTML: hostile markdown stays text, and nothing on the page loads from another host.
import { describe, expect, it } from 'vitest';
import { readSource } from '../../src/parse/read-source.ts';
import { renderBodyHtml } from '../../src/render/body-html.ts';
import { emergencyLead } from '../../src/render/emergency-lead.ts';

const render = (markdown: string) => renderBodyHtml(readSource('b.md', `---\nid: X\n---\n${markdown}\n`).body);

describe('renderBodyHtml', () => {
  it('turns an image from another host into a link instead of loading it', () => {
    const html = render('![Valve layout](https://attacker.invalid/track.png)');
    expect(html).not.toMatch(/<img/);
    expect(html).toContain('<a href="https://attacker.invalid/track.png" class="external-image">Image: Valve layout</a>');
    expect(render('![x](//attacker.invalid/p.png)')).not.toMatch(/<img|attacker\.invalid\/p\.png"/);
  });

  it('keeps images that come with the site', () => {
    expect(render('![Layout](images/k-210.png)')).toContain('<img src="images/k-210.png" alt="Layout">');
  });

  it('drops raw HTML and dangerous link targets', () => {
    const html = render('<script>alert(1)</script>\n\n[x](javascript:alert(1)) <img src=x onerror=alert(1)>');
    expect(html).not.toMatch(/<script|onerror|javascript:/i);
  });
});

describe('renderBodyHtml: GitHub Flavored Markdown', () => {
  it('renders a pipe table with a header row, column scopes and a named scroll area', () => {
    // Source: GitHub Flavored Markdown Spec 0.29, section 4.10 Tables (extension): a header row, a delimiter row, then data rows.
    const html = render('| Valve | Position |\n| --- | --- |\n| XV-902 | LOCKED OPEN |');
    expect(html).not.toContain('| Valve |');
    expect(html).toContain('<div class="scroll-x body-table" role="region" tabindex="0" aria-label="Table: Valve, Position"><table>');
    expect(html).toMatch(/<thead>\s*<tr>\s*<th scope="col">Valve<\/th>\s*<th scope="col">Position<\/th>\s*<\/tr>\s*<\/thead>/);
    expect(html).toMatch(/<tbody>\s*<tr>\s*<td>XV-902<\/td>\s*<td>LOCKED OPEN<\/td>/);
  });

  it('keeps a column\'s alignment', () => {
    // Source: GitHub Flavored Markdown Spec 0.29, section 4.10: a colon on the right of the delimiter row aligns the column right.
    expect(render('| Tag | Setpoint |\n| :-- | --: |\n| PIC-902 | 4.5 barg |')).toContain('<td align="right">4.5 barg</td>');
  });

  it('renders strikethrough and task list items, the box as a mark that says whether it is done', () => {
    // Source: GitHub Flavored Markdown Spec 0.29, sections 5.3 Task list items and 6.5 Strikethrough (extensions).
    const html = render('~~OPEN~~ CLOSED\n\n- [x] Drain D-902 closed\n- [ ] Sample point capped');
    expect(html).toContain('<del>OPEN</del> CLOSED');
    expect(html).toContain('<span class="task-mark" role="img" aria-label="Done">☑</span> Drain D-902 closed');
    expect(html).toContain('<span class="task-mark" role="img" aria-label="Not done">☐</span> Sample point capped');
    expect(html).not.toContain('<input');
  });

  it('renders footnotes whose links reach their targets', () => {
    const html = render('Call the control room[^radio].\n\n[^radio]: Radio channel 4 when the phones are down.');
    expect(html).toContain('Radio channel 4 when the phones are down.');
    const hrefs = [...html.matchAll(/href="#([^"]+)"/g)].map((m) => m[1]);
    const ids = new Set([...html.matchAll(/id="([^"]+)"/g)].map((m) => m[1]));
    expect(hrefs.length).toBe(2);
    for (const target of hrefs) expect(ids.has(target), target).toBe(true);
    for (const id of ids) expect(id.startsWith('body-')).toBe(true);
    expect(html).toMatch(/<h3 id="body-footnote-label">Footnotes<\/h3>/);
  });

  it('keeps a telephone link, so a tablet can call the number', () => {
    expect(render('[Control room 5555](tel:5555)')).toContain('<a href="tel:5555">Control room 5555</a>');
  });
});

describe('emergencyLead: the narrative in parts', () => {
  it('gives each part the footnotes and link definitions written in another, with ids of its own', () => {
    const body = readSource('e.md', `---\nid: X\n---\n## Conditions that require this procedure\n\nLoss of cooling water[^cw], see [the plan][erp].\n\n## Notes\n\nKeep clear[^zone].\n\n[^cw]: Header pressure PI-901 below 2 barg.\n[^zone]: Five metres around K-210.\n\n[erp]: https://intranet.alder-reach.example/erp/u2\n`).body;
    const lead = emergencyLead(body, []);
    const conditions = lead.conditions?.html ?? '';
    expect(conditions).toContain('Header pressure PI-901 below 2 barg.');
    expect(conditions).toContain('<a href="https://intranet.alder-reach.example/erp/u2">the plan</a>');
    expect(conditions).toContain('id="lead-conditions-fn-cw"');
    expect(conditions).not.toContain('Five metres');
    expect(lead.restHtml).toContain('Five metres around K-210.');
    expect(lead.restHtml).not.toContain('PI-901');
    expect(lead.restHtml).toContain('id="body-fn-zone"');
  });
});

describe('emergencyLead: conditions and responsibility as front-matter keys', () => {
  const scopeOnly = () => readSource('e.md', `---\nid: X\n---\n## Scope\n\nKettle K-210 only.\n\n## Notes\n\nKeep clear.\n`).body;

  it('shows the keys where the body sections would be, and the scope stays in the narrative', () => {
    const lead = emergencyLead(scopeOnly(), [], 6, { conditions: ['TI-210 at 250 degC or above', 'Loss of agitator M-210'], responsible: 'Board operator initiates; shift supervisor takes command' });
    expect(lead.conditions?.title).toBe('Conditions that require this shutdown');
    expect(lead.conditions?.html).toContain('<li>TI-210 at 250 degC or above</li>');
    expect(lead.conditions?.html).toContain('<li>Loss of agitator M-210</li>');
    expect(lead.responsibility?.title).toBe('Responsibility');
    expect(lead.responsibility?.html).toContain('Board operator initiates; shift supervisor takes command');
    expect(lead.restHtml).toContain('Kettle K-210 only.');
  });

  it('shows one condition as a sentence, and escapes the text', () => {
    const lead = emergencyLead(scopeOnly(), [], 6, { conditions: ['PI-210 > 300 kPaa <script>'] });
    expect(lead.conditions?.html).toContain('<p>PI-210 > 300 kPaa');
    expect(lead.conditions?.html).not.toContain('<script>');
    expect(lead.responsibility).toBeUndefined();
  });

  it('keeps both forms when the author wrote both: the key first, then the section', () => {
    const body = readSource('e.md', `---\nid: X\n---\n## Responsibility\n\nThe area operator assists.\n`).body;
    const lead = emergencyLead(body, [], 6, { responsible: 'Shift supervisor takes command' });
    const html = lead.responsibility?.html ?? '';
    expect(html.indexOf('Shift supervisor takes command')).toBeLessThan(html.indexOf('The area operator assists.'));
    expect(lead.restHtml).not.toContain('The area operator assists.');
  });
});
