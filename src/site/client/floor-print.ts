// Fills the printed date into the "uncontrolled when printed" marks, on load and again just before printing.
export function setUpPrintMarks(root: Document = document, now: () => Date = () => new Date()): void {
  const stamp = () => {
    const printed = isoDate(now());
    for (const el of root.querySelectorAll<HTMLElement>('[data-print-stamp]')) {
      el.textContent = `Uncontrolled when printed — printed ${printed}`;
    }
    // The page-margin footer cannot read the DOM, so the dated words go into an @page rule of their own.
    let rule = root.querySelector<HTMLStyleElement>('style[data-print-page-stamp]');
    if (!rule) {
      rule = root.createElement('style');
      rule.dataset.printPageStamp = '';
      root.head.appendChild(rule);
    }
    rule.textContent = `@page { @bottom-center { content: ${JSON.stringify(`Uncontrolled when printed — printed ${printed}`)}; } }`;
  };
  stamp();
  addEventListener('beforeprint', stamp);
  // Browsers that cannot put text in page margins get a footer fixed to every printed page instead.
  if (!('CSSMarginRule' in globalThis)) root.documentElement.classList.add('print-fixed-footer');
}

export function isoDate(date: Date): string {
  const pad = (n: number) => String(n).padStart(2, '0');
  return `${date.getFullYear()}-${pad(date.getMonth() + 1)}-${pad(date.getDate())}`;
}
