// Each command's help text, apart from the command: `stepwright help <command>` and `stepwright <command> --help`
// print it without loading the command's module (the checker, the units and language libraries, the site stack).
// Only light modules are imported here; tests/cli/light-start.test.ts checks what these commands load.
import { configFileName } from '../model/config-file-name.ts';
import { kinds } from '../model/kinds.ts';
import { manifestFile, privateKeyFile, publicKeyFile } from './site-manifest.ts';

export const buildHelp = `Usage: stepwright build [options] [folder]

Checks every procedure in the folder (default: see --procedures), then builds
the operator manual as a static site and indexes it for search. A build with check errors stops
with the same report as 'stepwright check' and leaves the last good site untouched.
The review date marks use $STEPWRIGHT_TODAY or the date of the last commit, so builds repeat exactly.

Options:
  --out <dir>           where the site goes (default: dist/ beside the config file found from here,
                        else at the top of the repository): a new or empty folder, or one a build published
                        before; a folder holding other files, or the procedures, the register, the
                        configuration or the repository, is refused and left as it is; a link
                        there is replaced by the build's own (what it pointed to is left as it was)
  --procedures <dir>    the procedures folder, same as the folder argument (default: $STEPWRIGHT_PROCEDURES,
                        else 'procedures' in the config file, else procedures/)
  --config <file>       the configuration (default: the nearest stepwright.config.yaml from this
                        folder up to the top of the git repository)
  --base <path>         the path the manual is served under, such as /manual/ (default: 'base' in the
                        config file, else the site's root); every link, the search and the offline copy
                        stay under it
  --no-index            skip the search index
  --sign-key <f>        sign the site's manifest with this ed25519 private key (from 'stepwright keygen';
                        default: $STEPWRIGHT_SIGNING_KEY). Every build writes ${manifestFile},
                        the SHA-256 of every published file, for 'stepwright verify'.
  -h, --help            show this help

The output path is a link to the newest complete build in <out>.versions/, replaced in one step, so it
holds a complete site at every moment, even when a build is killed.

A rebuild draws again only the pages of procedures whose sources, history, related procedures, register,
configuration or date changed, and keeps the others from the last build once each file is found to be the
one it published. The record is kept in .stepwright/cache/ ($STEPWRIGHT_CACHE; 'off' draws every page).

Exit codes: 0 built, 1 check errors or a failed build, 2 usage or internal failure.
`;

export const checkHelp = `Usage: stepwright check [options] [paths…]

Checks procedure files (markdown with YAML front-matter) and reports every problem with
file:line:column, severity, rule id, message and a hint. Paths may be files or folders
(default: the procedures folder, see --procedures), globs such as 'procedures/**/pump-*.md', or '-' for one procedure on
standard input. Folders and globs are searched for *.md files (.MD too); markdown there that is not a
procedure (no front-matter and no procedure keys, e.g. a README) is skipped with an info line.
Rules that read the date judge at today's date ($STEPWRIGHT_TODAY when set); when the date
'stepwright build' uses (the last commit's) differs, they judge at that date too, and the errors
found only there are reported, so that a check does not pass where the build would stop.

Options:
  --format <human|json|github|sarif>  output format (default: human); github prints workflow
                          annotations, sarif a SARIF 2.1.0 log for code-scanning views
  --quiet                 print errors only
  --explain               also print each file's step graph, the proof method, the states explored,
                          its loops and exits, and how each decision splits the signal space
  --base <ref>            judge changes against this git ref (default: HEAD, the last commit)
  --no-history            do not read git history (the revision and status rules stay silent)
  --procedures <dir>      the procedures folder (default: $STEPWRIGHT_PROCEDURES, else 'procedures' in the
                          config file, else procedures/)
  --config <file>         rule severities and per-folder overrides (default: the nearest
                          stepwright.config.yaml from this folder up to the top of the git repository)
  -h, --help              show this help

Exit codes: 0 no errors (warnings allowed), 1 errors found, 2 usage or internal failure.
`;

export const devHelp = `Usage: stepwright dev [options] [folder]

Live preview of the operator manual while you write: serves the pages straight from the procedures
folder (default: see --procedures), re-checks a procedure when you save it and shows
its findings on its page. Nothing is published; use 'stepwright build' for the manual.

Options:
  --port <n>            port (default: 4321)
  --host <host>         address to listen on (default: localhost)
  --procedures <dir>    the procedures folder, same as the folder argument (default: $STEPWRIGHT_PROCEDURES,
                        else 'procedures' in the config file, else procedures/)
  --base <path>         serve the pages under this path, such as /manual/ (default: 'base' in the
                        config file, else the root)
  --cache-dir <dir>     where the preview keeps its working files (default: .stepwright/dev beside the config
                        file, else at the top of the repository); nothing
                        is written into the installed package
  --config <file>       the configuration (default: the nearest stepwright.config.yaml from this
                        folder up to the top of the git repository)
  -h, --help            show this help
`;

export const exportHelp = `Usage: stepwright export ID [--format json|mermaid] [--inline] [--force] [paths…]

Prints one procedure of the manual for use elsewhere:
  json      the checked model: identity, document control, signals, limits, interlocks, hazards,
            the step tree (with each item's YAML path), the narrative body as markdown, and the
            cycle-time estimate
  mermaid   a mermaid flowchart of the sequence (steps, decisions, parallel branches, loops)

The manual is read from paths (default: procedures/) so that calls can be expanded. A procedure with
check errors is not exported (run 'stepwright check' first), unless --force is given.

Options:
  --format <json|mermaid>   output format (default: json)
  --inline                  expand 'call' steps into the called procedures' steps
  --force                   export even when the procedure has check errors
  -h, --help                show this help

Exit codes: 0 exported, 1 not found or has errors, 2 usage or internal failure.
`;

export const initHelp = `Usage: stepwright init [options]

Sets up this repository for Stepwright: ${configFileName}, a procedures folder with one example
procedure and the plant register entries it uses, ignore entries for the built manual and caches, editor settings that map the front-matter
schema to the procedure files, and a CI workflow (.github/workflows/procedures.yml) that checks every
push, posts the review on pull requests and builds the manual on the main branch.
Never overwrites a file: whatever exists already is left as it is and named in the output.

Options:
  --procedures <dir>   the procedures folder to create (default: procedures)
  --demo               copy the whole demo manual (Alder Reach Chemicals, Unit 2) and its plant register instead of one example
  -h, --help           show this help

Exit codes: 0 done (also when everything existed), 2 usage failure.
`;

export const keygenHelp = `Usage: stepwright keygen [options] [folder]

Writes a new ed25519 key pair into the folder (default: the current folder):
  ${privateKeyFile}       the private key: give it to 'stepwright build --sign-key'; keep it secret,
                                   out of the procedures repository
  ${publicKeyFile}   the public key: give it to 'stepwright verify --public-key'
An existing key file is never overwritten.

Options:
  -h, --help      show this help

Exit codes: 0 written, 1 a key file already exists or could not be written, 2 usage failure.
`;

export const newHelp = `Usage: stepwright new KIND ID [--title TEXT] [--dir FOLDER] [--procedures DIR]

Writes FOLDER/<id>.md, a new draft procedure with every section its kind needs. Each thing you must
supply is marked TODO; 'stepwright check' lists the ones left (rule placeholder-text).
Never overwrites a file, and refuses an id the manual already uses.

KIND is one of: ${kinds.join(', ')}
ID   is the document number, upper-case letters, digits and hyphens, e.g. U2-K210-SD-002

Options:
  --title <text>    the title (otherwise a TODO placeholder)
  --dir <folder>    where to write it, inside the procedures folder (default: the procedures folder)
  --procedures <dir>  the procedures folder (default: $STEPWRIGHT_PROCEDURES, else 'procedures' in the
                    config file, else procedures/)
  -h, --help        show this help

Exit codes: 0 written, 1 not written (file exists, id in use, or --dir outside the procedures folder),
2 usage error.
`;

export const reviewHelp = `Usage: stepwright review --base <ref> [options] [paths…]

Summarises the procedure changes between the merge base of <ref> and the working copy, for a pull
request: per changed procedure the revision and status change, the safety-relevant changes (hazards,
interlocks, limits, setpoints, transitions on guarded signals, removed hazard messages), a table of
step changes, the sign-offs the review policy requires, the check results and a mermaid flowchart with
the changed steps marked. Paths default to the procedures folder (see --procedures). See docs/review.md.

Options:
  --base <ref>                 the branch or commit the change is reviewed against (required)
  --format <markdown|github|json>  markdown (default) prints the summary; json the same facts for
                               tools (files, change, revision and status before/after, sign-offs,
                               check results); github prints workflow
                               annotations for the check problems of the changed files
  --output <file>              also write the Markdown summary to this file
  --procedures <dir>           the procedures folder (default: $STEPWRIGHT_PROCEDURES, else
                               'procedures' in the config file, else procedures/)
  --config <file>              the configuration with the review policy (default: the nearest
                               stepwright.config.yaml up to the top of the git repository)
  -h, --help                   show this help

Exit codes: 0 no errors in the changed files, 1 errors found, 2 usage, git or internal failure.
`;

export const schemaHelp = `Usage: stepwright schema [--register] [--out FILE]

Prints the JSON Schema of a procedure's front-matter (generated from the one schema 'check' uses),
or writes it to FILE. Editors with YAML support use it to complete and validate keys; see docs/editor.md.

Options:
  --register     the schema of a plant register file instead (docs/register.md)
  --out <file>   write the schema to this file instead of printing it
  -h, --help     show this help
`;

export const serveHelp = `Usage: stepwright serve [options]

Serves the built manual (see 'stepwright build') on http://localhost:4321.

Options:
  --dir <dir>     the site folder (default: dist/ beside the config file, else at the top of the
                  repository)
  --port <n>      port (default: 4321; 0 picks a free one)
  --host <host>   address to listen on (default: localhost)
  --base <path>   serve the manual under this path (default: the path the site was built for,
                  recorded by 'stepwright build'; else 'base' in the config file, else the root)
  --config <file> the configuration (default: the nearest stepwright.config.yaml)
  -h, --help      show this help
`;

export const verifyHelp = `Usage: stepwright verify [options] [<site folder>]

Checks a published manual, whole. First every file against the build's manifest (${manifestFile},
the SHA-256 of every published file): a changed page, an added or a removed file is named. With the
plant's public key the manifest's ed25519 signature is checked too, so a forged manifest is named.
Then every procedure page against the procedure sources: each page carries the SHA-256 of the source
text it was built from; verify names every page whose source has changed or is gone, and every source
that has no page. Each page also records the plant register files and the configuration it was built
with; verify names a page whose register file or configuration has changed since, and says of a page of
an older build, which records none, that it was not checked against the register. It also says what it found at the site path (a link to a published version, a folder,
or nothing because a build was stopped while publishing).

Options:
  --procedures <dir>   the procedure sources (default: $STEPWRIGHT_PROCEDURES, else 'procedures' in
                       the nearest stepwright.config.yaml, else procedures/)
  --public-key <file>  the ed25519 public key from 'stepwright keygen' (default: $STEPWRIGHT_PUBLIC_KEY,
                       else ${publicKeyFile} in the current folder when it exists)
  --repair             when a stopped build left no site at the path, put the newest complete one back
  -h, --help           show this help

Exit codes: 0 everything matches, 1 a file, the signature, a page, a source, a register file or the
configuration does not match (or a page could not be checked against the register), or there is no
site, 2 usage failure.
`;

export const commandHelp: Record<string, string> = {
  build: buildHelp,
  check: checkHelp,
  dev: devHelp,
  export: exportHelp,
  init: initHelp,
  keygen: keygenHelp,
  new: newHelp,
  review: reviewHelp,
  schema: schemaHelp,
  serve: serveHelp,
  verify: verifyHelp,
};
