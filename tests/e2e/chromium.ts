// The one way the tests start headless Chromium (Debian's /usr/bin/chromium, driven by playwright-core).
import { chromium, type Browser } from 'playwright-core';

export const chromiumPath = '/usr/bin/chromium';

/**
 * Features playwright-core 1.65 turns off at every launch (its `disabledFeatures`, kept here in the same order).
 * Chromium reads only the last `--disable-features` switch, so a launch that turns off one more feature has to
 * repeat these; tests/e2e/chromium.test.ts fails when a playwright upgrade changes its list.
 */
export const playwrightDisabledFeatures = [
  'AvoidUnnecessaryBeforeUnloadCheckSync', 'DestroyProfileOnBrowserClose', 'HttpsUpgrades', 'HttpsFirstBalancedModeAutoEnable',
  'LensOverlay', 'MediaRouter', 'PaintHolding', 'ThirdPartyStoragePartitioning', 'AvoidCorsURLLoaderRestartOnRedirect',
  'TcpPortRandomizationWin', 'OptimizationHints', 'NetworkTimeServiceQuerying', 'AimEnabled', 'PreconnectToSearch',
  'msForceBrowserSignIn', 'msEdgeUpdateLaunchServicesPreferredVersion',
];

/**
 * Chromium 156 builds the address bar's drop-down as a web page of its own (two hidden chrome:// pages, in a
 * renderer of their own) for every new window, so for every browser context a test opens: about 1.5 s of CPU
 * each, measured on the 2-core machine, for a window nobody sees. The tests open some two hundred contexts.
 */
export const unseenBrowserParts = ['WebUIOmniboxPopup', 'WebUIOmniboxAimPopup', 'WebUIOmniboxFullPopup'];

/**
 * With every site in a process of its own, Chromium starts a spare renderer process ahead of the next page. A
 * renderer serves one browser context only, and each test opens a context of its own, so every spare was started
 * for nothing: two renderer processes per context instead of one. Measured on the 2-core machine, 20 contexts
 * each loading a manual page: 14.3 and 13.8 CPU-s of Chromium with the spare, 10.3 and 10.3 without.
 */
export const unusedSpares = ['SpareRendererForSitePerProcess'];

export const chromiumArgs = [
  '--headless', '--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update',
  '--disable-sync', '--no-first-run', `--disable-features=${[...playwrightDisabledFeatures, ...unseenBrowserParts, ...unusedSpares].join(',')}`,
];

export function launchBrowser(): Promise<Browser> {
  return chromium.launch({ executablePath: chromiumPath, args: chromiumArgs });
}
