// The narrative body as HTML: hostile markdown stays text, and nothing on the page loads from another host.
import { describe, expect, it } from 'vitest';
import { readSource } from '../../src/parse/read-source.ts';
import { renderBodyHtml } from '../../src/render/body-html.ts';

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
