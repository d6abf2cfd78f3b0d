// Plant-floor behaviour on every page: theme toggle, offline copy and print marks. All of it is optional extra;
// the pages read fully without it.
import { setUpOffline } from './floor-offline.ts';
import { setUpPrintMarks } from './floor-print.ts';
import { setUpThemeToggle } from './floor-theme.ts';

setUpThemeToggle();
setUpPrintMarks();
setUpOffline();
