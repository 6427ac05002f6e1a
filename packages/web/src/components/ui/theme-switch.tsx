import { useEffect, useState } from 'react';

type Theme = 'system' | 'light' | 'dark';
const storageKey = 'rolloff.theme';

function readTheme(): Theme {
  const saved = localStorage.getItem(storageKey);
  return saved === 'light' || saved === 'dark' ? saved : 'system';
}

/** Follows the system theme unless the user picks light or dark; remembered per browser. */
export function ThemeSwitch() {
  const [theme, setTheme] = useState<Theme>(readTheme);
  useEffect(() => {
    const root = document.documentElement;
    if (theme === 'system') {
      root.removeAttribute('data-theme');
      localStorage.removeItem(storageKey);
    } else {
      root.setAttribute('data-theme', theme);
      localStorage.setItem(storageKey, theme);
    }
  }, [theme]);
  return (
    <label className="flex items-center gap-2 text-sm text-ink-soft">
      <span className="sr-only">Theme</span>
      <select value={theme} onChange={(event) => setTheme(event.target.value as Theme)} className="rounded-md border border-rule bg-panel px-2 py-1 text-ink">
        <option value="system">System theme</option>
        <option value="light">Light</option>
        <option value="dark">Dark</option>
      </select>
    </label>
  );
}
