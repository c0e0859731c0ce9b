import fs from 'node:fs';
import { mkdtemp, rm, stat, writeFile } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import { parseArgs } from 'node:util';
import type { RepositoryDTO } from '../../shared/api/repositories';
import type { CloneClassDetailDTO, CloneClassPageDTO, SnapshotAnswerDTO, SnapshotDTO } from '../../shared/api/snapshots';
import type { CurrentApiTokenDTO } from '../../shared/api/tokens';
import { packFolder } from '../ingest/pack';
import { exceedsBudget, parseBudget, type CloneBudget } from '../reports/budget';
import { SARIF_STATUSES, snapshotSarif } from '../reports/snapshot-sarif';
import { processIo, type CommandIo } from './command';

const USAGE = `usage: doublet push --server URL --label LABEL [--token TOKEN] [--repository ID]
                    [--budget R] [--wait | --no-wait] [--timeout MINUTES] [--format text|json|sarif] [--out FILE] [FOLDER]

Packs FOLDER (default: the current folder) as a tar.gz, leaving out .git, symbolic links, the
folders the analyzers never read (node_modules, dist, vendor…) and the repository's ignore list;
uploads it to the Doublet server as a snapshot of the token's repository labelled LABEL; waits for the
load, printing its progress on stderr; then prints the clone ratio, the new and drifted classes
and the budget verdict.
  --server URL      the Doublet server (or DOUBLET_SERVER)
  --repository ID   the repository's id, as in its page's address (or DOUBLET_REPOSITORY);
                    optional: the token names its repository
  --token TOKEN     an API token of that repository (better: the DOUBLET_TOKEN environment
                    variable, which stays out of process lists and CI logs)
  --budget R        judge the release against R (0.05 or 5%) instead of the repository's budget
  --wait            wait for the load (the default)
  --no-wait         exit 0 once the server has accepted the upload
  --timeout M       give up waiting after M minutes (default 60)
  --format F        text (default), json (the snapshot and the verdict) or sarif (a SARIF 2.1.0
                    log of the new and drifted clone classes, for code-scanning tools)
  --out FILE        write the summary to FILE instead of stdout
Exit codes: 0 loaded and within the budget (or no budget), 1 loaded but over the budget,
2 anything else (bad options, refused token, upload refused, load failed, timeout), with the
reason on stderr.
`;

/** Exit codes of `doublet push` (documented in its usage and the README). */
export const PUSH_EXIT = { ok: 0, overBudget: 1, error: 2 } as const;

/** Anything that ends a push with exit code 2; the message is printed as it is. */
class PushError extends Error {}

/** What the server said, in words, from its `{ error: { message } }` answer. */
async function refusal(res: Response, doing: string): Promise<PushError> {
  const body = (await res.json().catch(() => null)) as { error?: { message?: string } } | null;
  const reason = body?.error?.message ?? res.statusText;
  const hint =
    res.status === 401
      ? ' Check the token (DOUBLET_TOKEN): it may be mistyped, revoked or expired.'
      : res.status === 403
        ? ' The token belongs to another repository, or may not do this.'
        : '';
  return new PushError(`${doing} failed (HTTP ${res.status}): ${reason}${hint}`);
}

/** Talks to one server with one token. */
class Server {
  constructor(
    readonly base: string,
    private readonly token: string,
  ) {}

  async request(method: string, path: string, body?: FormData): Promise<Response> {
    try {
      return await fetch(`${this.base}/api${path}`, {
        method,
        headers: { Authorization: `Bearer ${this.token}`, accept: 'application/json' },
        body,
        signal: AbortSignal.timeout(10 * 60 * 1000),
      });
    } catch (error) {
      const cause = (error as { cause?: { message?: string } }).cause?.message;
      throw new PushError(`cannot reach ${this.base}: ${cause ?? (error as Error).message}`);
    }
  }

  async json<T>(method: string, path: string, doing: string, body?: FormData): Promise<T> {
    const res = await this.request(method, path, body);
    if (!res.ok) throw await refusal(res, doing);
    return (await res.json()) as T;
  }
}

function serverUrl(text: string): string {
  let url: URL;
  try {
    url = new URL(text);
  } catch {
    throw new PushError(`--server must be a URL like https://doublet.example (got "${text}")`);
  }
  if (url.protocol !== 'https:' && url.protocol !== 'http:') throw new PushError(`--server must be an http:// or https:// URL (got "${text}")`);
  return url.origin + url.pathname.replace(/\/+$/, '');
}

function positiveInteger(text: string, option: string, max: number): number {
  if (!/^[1-9][0-9]*$/.test(text) || Number(text) > max) throw new PushError(`${option} must be a whole number from 1 to ${max} (got "${text}")`);
  return Number(text);
}

const percent = (share: number | null | undefined) => (share === null || share === undefined ? '—' : `${(share * 100).toFixed(1)} %`);

/** The verdict of a ready snapshot: its unwaived clone ratio against the budget (exact, as the server judges). */
function verdictOf(snapshot: SnapshotDTO, budget: CloneBudget | null): 'within' | 'over' | 'none' {
  if (!budget || !snapshot.metrics) return 'none';
  const { unwaivedClonedTokens, fragmentTokens } = snapshot.metrics;
  return exceedsBudget({ clonedTokens: unwaivedClonedTokens, fragmentTokens }, budget) ? 'over' : 'within';
}

function summaryText(snapshot: SnapshotDTO, repository: RepositoryDTO, budget: CloneBudget | null, link: string): string {
  const m = snapshot.metrics;
  const verdict = verdictOf(snapshot, budget);
  const lines = [
    `${repository.name} ${snapshot.label}: ${snapshot.fileCount} files, ${snapshot.fragmentCount} fragments.`,
    m
      ? `Clone ratio ${percent(m.cloneRatio)}${m.unwaivedCloneRatio !== m.cloneRatio ? ` (${percent(m.unwaivedCloneRatio)} without waived classes)` : ''}; ` +
        `${m.classCount} clone classes, ${m.newClassCount} new, ${m.driftedClassCount} drifted, ${m.goneClassCount} gone since the previous release.`
      : `Clone ratio ${percent(snapshot.cloneRatio)}.`,
    verdict === 'none' ? 'No clone budget set.' : `Clone budget ${budget!.text}: ${verdict === 'over' ? 'OVER BUDGET' : 'within budget'}.`,
    link,
  ];
  return `${lines.join('\n')}\n`;
}

/** Prints a progress line on stderr when it changes (redrawn in place on a terminal). */
function progressLine(io: CommandIo, snapshot: SnapshotDTO, last: { text: string }): void {
  const p = snapshot.progress;
  const text =
    snapshot.status === 'queued'
      ? 'queued: waiting for a worker'
      : p
        ? `${p.phase}${p.total > 0 ? ` ${p.done} of ${p.total}` : ''}`
        : snapshot.status;
  if (text === last.text) return;
  last.text = text;
  io.err(io.errIsTTY ? `\r${text}\x1b[K` : `${text}\n`);
}

/** At most this many classes go into a SARIF log (one detail request each); the rest are counted. */
export const MAX_SARIF_CLASSES = 500;
const CLASS_PAGE_SIZE = 200;

/**
 * The snapshot's new and drifted classes with their members (paths and lines), largest first, at
 * most MAX_SARIF_CLASSES in all, through the routes a read token may use.
 */
async function reviewClasses(server: Server, snapshotId: number): Promise<{ classes: CloneClassDetailDTO[]; omitted: number }> {
  const classes: CloneClassDetailDTO[] = [];
  let total = 0;
  for (const status of Object.keys(SARIF_STATUSES)) {
    for (let page = 1; ; page++) {
      const query = new URLSearchParams({ status, sort: 'tokens', order: 'desc', page: String(page), pageSize: String(CLASS_PAGE_SIZE) });
      const answer = await server.json<CloneClassPageDTO>('GET', `/snapshots/${snapshotId}/classes?${query}`, 'Reading the clone classes');
      if (page === 1) total += answer.total;
      for (const summary of answer.classes.slice(0, MAX_SARIF_CLASSES - classes.length)) {
        classes.push(await server.json<CloneClassDetailDTO>('GET', `/clone-classes/${summary.id}`, 'Reading a clone class'));
      }
      if (classes.length >= MAX_SARIF_CLASSES || answer.classes.length < CLASS_PAGE_SIZE || page * CLASS_PAGE_SIZE >= answer.total) break;
    }
  }
  return { classes, omitted: total - classes.length };
}

/** `doublet push`: pack a folder, upload it as a snapshot, wait for it, judge it against the budget. */
export async function run(args: string[], io: CommandIo = processIo()): Promise<number> {
  let workDir: string | undefined;
  try {
    const { values, positionals } = parseArgs({
      args,
      allowPositionals: true,
      options: {
        server: { type: 'string' },
        repository: { type: 'string' },
        label: { type: 'string' },
        token: { type: 'string' },
        budget: { type: 'string' },
        wait: { type: 'boolean' },
        'no-wait': { type: 'boolean' },
        timeout: { type: 'string' },
        format: { type: 'string' },
        out: { type: 'string' },
        help: { type: 'boolean' },
      },
    });
    if (values.help) {
      io.out(USAGE);
      return PUSH_EXIT.ok;
    }
    const serverText = values.server ?? process.env.DOUBLET_SERVER;
    const repositoryText = values.repository ?? process.env.DOUBLET_REPOSITORY;
    const token = values.token ?? process.env.DOUBLET_TOKEN;
    if (!serverText) throw new PushError('--server (or DOUBLET_SERVER) is required');
    if (!values.label?.trim()) throw new PushError('--label is required: the release name, e.g. the tag or the commit');
    if (!token) throw new PushError('an API token is required: set DOUBLET_TOKEN (or pass --token)');
    if (positionals.length > 1) throw new PushError('give at most one folder');
    if (values.wait && values['no-wait']) throw new PushError('--wait and --no-wait exclude each other');
    const format = values.format ?? 'text';
    if (format !== 'text' && format !== 'json' && format !== 'sarif') throw new PushError(`--format must be text, json or sarif (got "${format}")`);
    let budgetOverride: CloneBudget | undefined;
    try {
      budgetOverride = values.budget === undefined ? undefined : parseBudget(values.budget);
    } catch (error) {
      throw new PushError(`--budget: ${(error as Error).message}`);
    }
    const givenRepositoryId = repositoryText === undefined ? undefined : positiveInteger(repositoryText, '--repository', 2_147_483_647);
    const timeoutMs = positiveInteger(values.timeout ?? '60', '--timeout', 24 * 60) * 60_000;
    const folder = path.resolve(positionals[0] ?? '.');
    if (!(await stat(folder).catch(() => undefined))?.isDirectory()) throw new PushError(`${positionals[0] ?? '.'} is not a folder`);
    const server = new Server(serverUrl(serverText), token);

    // 1. The repository (the token's own unless one is named): its ignore list (left out of the archive) and budget.
    const repositoryId =
      givenRepositoryId ?? (await server.json<CurrentApiTokenDTO>('GET', '/tokens/current', 'Finding the token\'s repository')).repository.id;
    const repository = await server.json<RepositoryDTO>('GET', `/repositories/${repositoryId}`, 'Reading the repository');

    // 2. Pack.
    workDir = await mkdtemp(path.join(os.tmpdir(), 'doublet-push-'));
    const archive = path.join(workDir, 'release.tar.gz');
    const packed = await packFolder(folder, archive, { ignore: repository.ignore });
    if (packed.files.length === 0) throw new PushError(`nothing to push: every file of ${folder} was left out`);
    io.err(`packed ${packed.files.length} files (${(packed.bytes / 1024).toFixed(0)} KiB), left out ${packed.leftOut.length}\n`);

    // 3. Upload (streamed from the file).
    const form = new FormData();
    form.set('label', values.label.trim());
    form.set('archive', await fs.openAsBlob(archive, { type: 'application/gzip' }), 'release.tar.gz');
    const uploaded = await server.json<SnapshotAnswerDTO>('POST', `/repositories/${repositoryId}/snapshots`, 'Uploading the release', form);
    let snapshot = uploaded.snapshot;
    const link = `${server.base}/snapshots/${snapshot.id}`;
    io.err(`uploaded as snapshot ${snapshot.id} (${link})\n`);
    if (values['no-wait']) return PUSH_EXIT.ok;

    // 4. Wait for the load: a poll a second at first, then every few seconds.
    const deadline = Date.now() + timeoutMs;
    const last = { text: '' };
    let delay = 1000;
    while (snapshot.status === 'queued' || snapshot.status === 'running') {
      progressLine(io, snapshot, last);
      if (Date.now() > deadline) throw new PushError(`snapshot ${snapshot.id} was still ${snapshot.status} after ${timeoutMs / 60_000} minutes (${link})`);
      await new Promise((resolve) => setTimeout(resolve, delay));
      delay = Math.min(5000, delay * 1.5);
      snapshot = await server.json<SnapshotDTO>('GET', `/snapshots/${snapshot.id}`, 'Reading the snapshot');
    }
    if (io.errIsTTY && last.text) io.err('\r\x1b[K');
    if (snapshot.status !== 'ready') throw new PushError(`the load of ${snapshot.label} ${snapshot.status}: ${snapshot.error ?? 'no reason given'} (${link})`);

    // 5. Summary and verdict.
    const budget = budgetOverride ?? (repository.cloneBudget === null ? null : parseBudget(String(repository.cloneBudget)));
    const verdict = verdictOf(snapshot, budget);
    let output: string;
    if (format === 'sarif') {
      const { classes, omitted } = await reviewClasses(server, snapshot.id);
      if (omitted > 0) io.err(`the SARIF log holds the first ${classes.length} new and drifted classes; ${omitted} more are on ${link}\n`);
      const log = snapshotSarif({ repository, snapshot, classes, budget: budget?.text ?? null, verdict, url: link, omittedClassCount: omitted });
      output = `${JSON.stringify(log, null, 2)}\n`;
    } else if (format === 'json') {
      output = `${JSON.stringify({ repository: { id: repository.id, name: repository.name }, snapshot, budget: budget?.text ?? null, verdict, url: link }, null, 2)}\n`;
    } else {
      output = summaryText(snapshot, repository, budget, link);
    }
    if (values.out) await writeFile(values.out, output);
    else io.out(output);
    return verdict === 'over' ? PUSH_EXIT.overBudget : PUSH_EXIT.ok;
  } catch (error) {
    if (error instanceof PushError) {
      io.err(`error: ${error.message}\n`);
      return PUSH_EXIT.error;
    }
    const code = (error as { code?: string }).code;
    if (code?.startsWith('ERR_PARSE_ARGS_')) {
      io.err(`error: ${(error as Error).message}\n${USAGE}`);
      return PUSH_EXIT.error;
    }
    io.err(`error: ${error instanceof Error ? error.message : String(error)}\n`);
    return PUSH_EXIT.error;
  } finally {
    if (workDir) await rm(workDir, { recursive: true, force: true });
  }
}
