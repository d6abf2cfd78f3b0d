// The colour theme toggle: Auto follows the system setting; Light or Dark is remembered on this device.
// The stored choice is applied before first paint by the inline boot script in FloorHead.astro.
export const themeKey = 'stepwright:theme';
type Choice = 'auto' | 'light' | 'dark';

export function setUpThemeToggle(root: Document = document): void {
  const group = root.querySelector<HTMLElement>('[data-theme-toggle]');
  if (!group) return;
  const buttons = [...group.querySelectorAll<HTMLButtonElement>('button[data-theme-choice]')];
  const show = (choice: Choice) => {
    for (const b of buttons) b.setAttribute('aria-pressed', String(b.dataset.themeChoice === choice));
  };
  show(readChoice());
  for (const b of buttons) {
    b.addEventListener('click', () => {
      const choice = b.dataset.themeChoice as Choice;
      try {
        if (choice === 'auto') localStorage.removeItem(themeKey);
        else localStorage.setItem(themeKey, choice);
      } catch { /* private mode: the choice lasts for this page only */ }
      if (choice === 'auto') delete root.documentElement.dataset.theme;
      else root.documentElement.dataset.theme = choice;
      show(choice);
    });
  }
  group.hidden = false;
}

function readChoice(): Choice {
  try {
    const stored = localStorage.getItem(themeKey);
    return stored === 'light' || stored === 'dark' ? stored : 'auto';
  } catch {
    return 'auto';
  }
}
