/**
 * Brackenfold Rail Freight's five repositories and what happens to them release after release:
 * steady growth and small edits everywhere, and the planted history README.md tells.
 */
import { ENTITIES } from './domain';
import { cloneModule, type FunctionDecl, type Module } from './ir';
import { printModel, printModule, type GeneratedFile, type Layout } from './layout';
import { javaClassName } from './print/java';
import { snake } from './print/common';
import { addFunction, addGuard, changeFigure, mainEntity, newModule, type Area } from './modules';
import { Random } from './random';

/** The one seed: every start generates the same code from it. */
export const DEMO_SEED = 20250115;

export interface RepositoryPlan {
  name: string;
  description: string;
  layout: Layout;
  cloneBudget: number | null;
  /** the records its code passes around */
  entities: string[];
  areas: Area[];
  labels: string[];
  /** first release day (ISO date) and days between releases */
  firstDay: string;
  everyDays: number;
  firstModules: number;
  finalModules: number;
  /** module names the story gives its own modules, kept from the everyday ones */
  reserved: string[];
}

export interface DemoRelease {
  label: string;
  /** ISO date, which orders the loads of all repositories into one history */
  date: string;
  files: GeneratedFile[];
}

export interface DemoRepository {
  name: string;
  description: string;
  cloneBudget: number | null;
  releases: DemoRelease[];
}

/** A fragment as the analyzers name it: file path and (qualified) function name. */
export interface FragmentRef {
  path: string;
  name: string;
}

/** Where the planted history shows: what the tests check and README.md tells. */
export interface DemoStory {
  /** a module copied and adapted within a repository: its classes appear at `label` */
  copied: { repository: string; label: string; from: string; to: string }[];
  /** a fix in one copy only: the fragment's class is drifted at `label` */
  drifted: { repository: string; label: string; fixed: FragmentRef; missed: FragmentRef }[];
  /** the copies merged back: no class holds a fragment of `removed` from `label` on */
  merged: { repository: string; label: string; removed: string; kept: string };
  /** a module copied into another repository */
  acrossRepositories: { repository: string; label: string; path: string; fromRepository: string; fromPath: string };
  /** the clone ratio over the budget from `overFrom` until (not including) `underAgain` */
  budget: { repository: string; budget: number; overFrom: string; underAgain: string };
  /** a class the lead waived after loading `afterLabel`, with the reason */
  waived: { repository: string; afterLabel: string; paths: string[]; reason: string };
}

/** One step of the seed, in order. */
export type DemoStep = { load: { repository: string; label: string } } | { waive: DemoStory['waived'] };

export interface Demo {
  repositories: DemoRepository[];
  steps: DemoStep[];
  story: DemoStory;
}

const labels = (n: number, label: (i: number) => string) => Array.from({ length: n }, (_, i) => label(i));

export const PLANS: RepositoryPlan[] = [
  {
    name: 'consignment-billing',
    description: 'Tariffs, charges and invoices for every consignment Brackenfold carries.',
    layout: { language: 'typescript', root: 'src' },
    cloneBudget: 0.37,
    entities: ['Consignment', 'Tariff', 'Invoice', 'Wagon', 'Depot'],
    areas: [
      { folder: 'tariffs', entities: ['Tariff', 'Consignment'], topics: ['bands', 'rates', 'surcharges', 'lookup', 'rules', 'indexation', 'quotes'] },
      { folder: 'invoicing', entities: ['Invoice'], topics: ['runs', 'reminders', 'credits', 'export', 'matching', 'adjustments'] },
      { folder: 'consignments', entities: ['Consignment'], topics: ['booking', 'checks', 'holds', 'weights', 'routing', 'returns', 'splits'] },
      { folder: 'accounts', entities: ['Invoice', 'Consignment'], topics: ['statements', 'limits', 'ageing', 'disputes', 'refunds', 'deposits'] },
      { folder: 'reports', entities: ['Consignment', 'Invoice', 'Wagon'], topics: ['daily', 'monthly', 'revenue', 'volumes', 'margins', 'forecasts'] },
    ],
    labels: labels(10, (i) => `2025.${String(i + 1).padStart(2, '0')}`),
    firstDay: '2025-01-14',
    everyDays: 30,
    firstModules: 32,
    finalModules: 54,
    reserved: ['tariffs/domestic-charges', 'tariffs/international-charges', 'consignments/intake-rules'],
  },
  {
    name: 'manifest-gateway',
    description: 'Receives consignment manifests from customers and hands them to planning.',
    layout: { language: 'typescript', root: 'src' },
    cloneBudget: 0.35,
    entities: ['Manifest', 'Consignment', 'Wagon', 'TrainPath'],
    areas: [
      { folder: 'intake', entities: ['Manifest', 'Consignment'], topics: ['parsing', 'checks', 'amendments', 'queues', 'duplicates', 'retries'] },
      { folder: 'handover', entities: ['Manifest', 'TrainPath'], topics: ['planning', 'notices', 'matching', 'priorities', 'cutoffs'] },
      { folder: 'customers', entities: ['Consignment'], topics: ['replies', 'limits', 'contacts', 'portals', 'quotas'] },
      { folder: 'audit', entities: ['Manifest', 'Wagon'], topics: ['trail', 'exports', 'alerts', 'retention', 'reviews'] },
    ],
    labels: labels(9, (i) => `2.${i}.0`),
    firstDay: '2025-02-03',
    everyDays: 33,
    firstModules: 22,
    finalModules: 40,
    reserved: ['intake/consignment-checks'],
  },
  {
    name: 'yard-planner',
    description: 'Plans shunting, siding use and wagon allocation in the yards.',
    layout: { language: 'java', root: 'com.brackenfold.yard' },
    cloneBudget: 0.5,
    entities: ['Wagon', 'Siding', 'Depot', 'Locomotive', 'TrainPath'],
    areas: [
      { folder: 'allocation', entities: ['Wagon', 'Locomotive'], topics: ['allocation', 'pools', 'swaps', 'reservations', 'transfers', 'balancing'] },
      { folder: 'shunting', entities: ['Siding', 'Wagon'], topics: ['moves', 'plans', 'conflicts', 'sequences', 'marshalling', 'releases'] },
      { folder: 'sidings', entities: ['Siding', 'Depot'], topics: ['capacity', 'occupancy', 'closures', 'bookings', 'lighting'] },
      { folder: 'departures', entities: ['TrainPath', 'Locomotive'], topics: ['readiness', 'consists', 'delays', 'brake-tests', 'handovers'] },
      { folder: 'messages', entities: ['Wagon', 'TrainPath'], topics: ['readers', 'writers', 'acknowledgements', 'routing'] },
    ],
    labels: labels(11, (i) => `r${17 + i}`),
    firstDay: '2025-01-06',
    everyDays: 27,
    firstModules: 34,
    finalModules: 56,
    reserved: ['messages/consist-message-v1', 'messages/consist-message-v2'],
  },
  {
    name: 'timetable-planner',
    description: 'Builds the weekly freight timetable: paths, crews and locomotives.',
    layout: { language: 'java', root: 'com.brackenfold.timetable' },
    cloneBudget: null,
    entities: ['TrainPath', 'CrewShift', 'Locomotive', 'Depot'],
    areas: [
      { folder: 'paths', entities: ['TrainPath'], topics: ['bids', 'conflicts', 'variations', 'calendar', 'possessions', 'margins'] },
      { folder: 'crews', entities: ['CrewShift'], topics: ['rosters', 'hours', 'relief', 'diagrams', 'route-knowledge', 'rest-rules'] },
      { folder: 'traction', entities: ['Locomotive', 'TrainPath'], topics: ['diagrams', 'fuel', 'balancing', 'exams', 'stabling'] },
      { folder: 'publishing', entities: ['TrainPath', 'Depot'], topics: ['exports', 'notices', 'changes', 'feeds', 'approvals'] },
    ],
    labels: labels(8, (i) => `3.${i + 1}.0`),
    firstDay: '2025-01-27',
    everyDays: 40,
    firstModules: 27,
    finalModules: 44,
    reserved: [],
  },
  {
    name: 'depot-maintenance',
    description: 'Inspections, work orders and wagon repairs at the maintenance depots.',
    layout: { language: 'python', root: 'depot_maintenance' },
    cloneBudget: 0.45,
    entities: ['Inspection', 'WorkOrder', 'Wagon', 'Depot'],
    areas: [
      { folder: 'inspections', entities: ['Inspection', 'Wagon'], topics: ['schedule', 'findings', 'rules', 'certificates', 'defects', 'sampling'] },
      { folder: 'work_orders', entities: ['WorkOrder'], topics: ['queue', 'costs', 'parts', 'closing', 'approvals', 'labour'] },
      { folder: 'fleet', entities: ['Wagon'], topics: ['condition', 'mileage', 'withdrawals', 'returns', 'modifications', 'leasing'] },
      { folder: 'depots', entities: ['Depot', 'WorkOrder'], topics: ['staffing', 'capacity', 'shifts', 'tooling', 'stores'] },
    ],
    labels: labels(12, (i) => `v1.${i}`),
    firstDay: '2025-01-03',
    everyDays: 25,
    firstModules: 30,
    finalModules: 52,
    reserved: ['inspections/brake-checks', 'inspections/bogie-checks'],
  },
];

/** The name the analyzers give a function of a module. */
export function fragmentName(layout: Layout, module: Module, fn: FunctionDecl): string {
  if (layout.language === 'python') return snake(fn.name);
  if (layout.language === 'java') return `${javaClassName(module.name)}.${fn.name}`;
  return fn.name;
}

const addDays = (iso: string, days: number) => new Date(Date.parse(`${iso}T00:00:00Z`) + days * 86_400_000).toISOString().slice(0, 10);

/** A repository's modules as they stand, in the order they were written, and the ones only the story touches. */
class Repository {
  readonly modules: Module[] = [];
  readonly frozen = new Set<string>();
  readonly names = new Set<string>();
  constructor(readonly plan: RepositoryPlan) {
    for (const name of plan.reserved) this.names.add(name);
  }

  module(name: string): Module {
    const found = this.modules.find((m) => m.name === name);
    if (!found) throw new Error(`no module ${name} in ${this.plan.name}`);
    return found;
  }

  ref(module: Module, fn: FunctionDecl): FragmentRef {
    return { path: printModule(this.plan.layout, module).path, name: fragmentName(this.plan.layout, module, fn) };
  }

  path(name: string): string {
    return printModule(this.plan.layout, this.module(name)).path;
  }

  /** A new module of the story's own, left alone by the everyday edits. */
  plant(rng: Random, area: Area, name: string, size: number): Module {
    const module = newModule(rng, area, this.plan.entities, this.names, size, name);
    this.modules.push(module);
    this.frozen.add(module.name);
    return module;
  }

  files(): GeneratedFile[] {
    const readme = { path: 'README.md', text: `# ${this.plan.name}\n\n${this.plan.description}\n\nOwned by Brackenfold Rail Freight's software team.\n` };
    const model = printModel(this.plan.layout, this.plan.entities.map((e) => ENTITIES[e]));
    return [readme, ...model, ...this.modules.map((m) => printModule(this.plan.layout, m))].sort((a, b) => (a.path < b.path ? -1 : a.path > b.path ? 1 : 0));
  }
}

/** A module's size: most have a handful of functions, a few have many. */
const moduleSize = (rng: Random) => (rng.chance(0.12) ? rng.int(16, 26) : rng.int(4, 13));

/** One release's everyday work: new modules, and a few edits to existing ones. */
function everydayWork(repo: Repository, rng: Random, release: number): void {
  const { plan } = repo;
  const remaining = plan.labels.length - release;
  const missing = plan.finalModules - repo.modules.filter((m) => !repo.frozen.has(m.name)).length;
  const added = Math.max(0, Math.round(missing / remaining) + rng.int(-1, 1));
  for (let i = 0; i < added; i++) repo.modules.push(newModule(rng, rng.pick(plan.areas), plan.entities, repo.names, moduleSize(rng)));
  const everyday = repo.modules.filter((m) => !repo.frozen.has(m.name));
  for (const module of rng.some(everyday, Math.max(2, Math.round(everyday.length * 0.08)))) {
    const choice = rng.int(0, 9);
    const fn = rng.pick(module.functions);
    if (choice < 3) addFunction(rng, module, mainEntity(module), plan.entities);
    else if (choice < 6) {
      if (!addGuard(rng, fn)) changeFigure(rng, fn);
    } else if (choice < 9) {
      if (!changeFigure(rng, fn)) addGuard(rng, fn);
    }
    else if (module.functions.length > 4) module.functions.splice(module.functions.indexOf(fn), 1);
  }
}

/**
 * A copy of a module under a new name, adapted as a team adapts a copy: every function renamed,
 * some given a guard or a different figure. Returns the copy and the functions left as they were
 * (apart from their names), whose pairs stay closest.
 */
function adaptedCopy(rng: Random, module: Module, name: string, rename: (fn: string) => string): { copy: Module; untouched: string[] } {
  const copy = cloneModule(module);
  copy.name = name;
  copy.doc = module.doc.replace(/\.$/, ', adapted from ') + module.name.slice(module.name.lastIndexOf('/') + 1) + '.';
  const untouched: string[] = [];
  for (const fn of copy.functions) {
    const original = fn.name;
    fn.name = rename(fn.name);
    const edit = rng.int(0, 2);
    if (edit === 0 && addGuard(rng, fn)) continue;
    if (edit === 1 && changeFigure(rng, fn)) continue;
    untouched.push(original);
  }
  for (const r of copy.records) r.name = rename(r.name);
  const renamedRecords = new Map(module.records.map((r, i) => [r.name, copy.records[i].name]));
  const retype = (t: FunctionDecl['returns']) => (t.kind === 'record' && renamedRecords.has(t.name) ? { ...t, name: renamedRecords.get(t.name)! } : t);
  for (const fn of copy.functions) {
    fn.returns = retype(fn.returns);
    const visit = (body: FunctionDecl['body']) => {
      for (const s of body) {
        if (s.s === 'return' && s.value?.e === 'new' && renamedRecords.has(s.value.type)) s.value.type = renamedRecords.get(s.value.type)!;
        if (s.s === 'if') {
          visit(s.then);
          visit(s.else ?? []);
        }
        if (s.s === 'for') visit(s.body);
      }
    };
    visit(fn.body);
  }
  return { copy, untouched };
}

/** The largest function (by statements) among the named ones: the fix that matters lands there. */
function largest(module: Module, names: string[]): FunctionDecl {
  const size = (body: FunctionDecl['body']): number =>
    body.reduce((n, s) => n + 1 + (s.s === 'if' ? size(s.then) + size(s.else ?? []) : s.s === 'for' ? size(s.body) : 0), 0);
  return module.functions.filter((x) => names.includes(x.name)).sort((a, b) => size(b.body) - size(a.body) || a.name.localeCompare(b.name))[0];
}

/** Generates the whole demo: every release of every repository, the order of the seed, and where the story shows. */
export function generateDemo(seed = DEMO_SEED): Demo {
  const story: Partial<DemoStory> & { copied: DemoStory['copied']; drifted: DemoStory['drifted'] } = { copied: [], drifted: [] };
  const repositories: DemoRepository[] = [];
  const dated: { date: string; order: number; step: DemoStep }[] = [];
  const shared: { module?: Module; path?: string } = {};

  for (const [order, plan] of PLANS.entries()) {
    const repo = new Repository(plan);
    const releases: DemoRelease[] = [];
    let untouchedCopy: string[] = [];
    for (let release = 0; release < plan.labels.length; release++) {
      const rng = Random.for(seed, plan.name, release);
      const label = plan.labels[release];
      if (release === 0) {
        for (let i = 0; i < plan.firstModules; i++) repo.modules.push(newModule(rng, rng.pick(plan.areas), plan.entities, repo.names, moduleSize(rng)));
      } else {
        everydayWork(repo, rng, release);
      }
      const planted = Random.for(seed, plan.name, 'story', release);

      if (plan.name === 'consignment-billing') {
        const area: Area = { folder: 'tariffs', entities: ['Consignment'], topics: [] };
        if (release === 0) {
          repo.plant(planted, area, 'tariffs/domestic-charges', 40);
          const intake: Area = { folder: 'consignments', entities: ['Consignment'], topics: [] };
          shared.module = repo.plant(planted, intake, 'consignments/intake-rules', 9);
          shared.path = repo.path('consignments/intake-rules');
        }
        if (release === 3) {
          const { copy, untouched } = adaptedCopy(planted, repo.module('tariffs/domestic-charges'), 'tariffs/international-charges', (n) => `${n}Abroad`);
          repo.modules.push(copy);
          repo.frozen.add(copy.name);
          untouchedCopy = untouched;
          story.copied.push({ repository: plan.name, label, from: repo.path('tariffs/domestic-charges'), to: repo.path(copy.name) });
          story.budget = { repository: plan.name, budget: plan.cloneBudget!, overFrom: label, underAgain: plan.labels[7] };
        }
        if (release === 5) {
          const domestic = repo.module('tariffs/domestic-charges');
          const fixed = largest(domestic, untouchedCopy);
          addGuard(planted, fixed);
          const international = repo.module('tariffs/international-charges');
          const missed = international.functions.find((x) => x.name === `${fixed.name}Abroad`)!;
          story.drifted.push({ repository: plan.name, label, fixed: repo.ref(domestic, fixed), missed: repo.ref(international, missed) });
        }
        if (release === 7) {
          const removed = repo.path('tariffs/international-charges');
          repo.modules.splice(repo.modules.indexOf(repo.module('tariffs/international-charges')), 1);
          // the one function that knew about other markets now lives beside the domestic ones
          addFunction(planted, repo.module('tariffs/domestic-charges'), ENTITIES.Consignment, plan.entities);
          story.merged = { repository: plan.name, label, removed, kept: repo.path('tariffs/domestic-charges') };
        }
      }

      if (plan.name === 'manifest-gateway' && release === 2) {
        const { copy } = adaptedCopy(planted, shared.module!, 'intake/consignment-checks', (n) => n);
        repo.modules.push(copy);
        repo.frozen.add(copy.name);
        story.acrossRepositories = { repository: plan.name, label, path: repo.path(copy.name), fromRepository: 'consignment-billing', fromPath: shared.path! };
      }

      if (plan.name === 'yard-planner') {
        const area: Area = { folder: 'messages', entities: ['Wagon'], topics: [] };
        if (release === 0) repo.plant(planted, area, 'messages/consist-message-v1', 5);
        if (release === 4) {
          const { copy } = adaptedCopy(planted, repo.module('messages/consist-message-v1'), 'messages/consist-message-v2', (n) => n);
          repo.modules.push(copy);
          repo.frozen.add(copy.name);
          story.copied.push({ repository: plan.name, label, from: repo.path('messages/consist-message-v1'), to: repo.path(copy.name) });
        }
        if (release === 5) {
          story.waived = {
            repository: plan.name,
            afterLabel: label,
            paths: [repo.path('messages/consist-message-v1'), repo.path('messages/consist-message-v2')],
            reason: 'Depots still send version 1 consist messages until the handheld terminals are replaced; the two readers stay apart on purpose so a change to version 2 cannot break version 1.',
          };
        }
      }

      if (plan.name === 'depot-maintenance') {
        const area: Area = { folder: 'inspections', entities: ['Inspection'], topics: [] };
        if (release === 0) repo.plant(planted, area, 'inspections/brake-checks', 12);
        if (release === 2) {
          const { copy, untouched } = adaptedCopy(planted, repo.module('inspections/brake-checks'), 'inspections/bogie-checks', (n) => n);
          repo.modules.push(copy);
          repo.frozen.add(copy.name);
          untouchedCopy = untouched;
          story.copied.push({ repository: plan.name, label, from: repo.path('inspections/brake-checks'), to: repo.path(copy.name) });
        }
        if (release === 6) {
          const brakes = repo.module('inspections/brake-checks');
          const fixed = largest(brakes, untouchedCopy);
          addGuard(planted, fixed);
          const bogies = repo.module('inspections/bogie-checks');
          story.drifted.push({ repository: plan.name, label, fixed: repo.ref(brakes, fixed), missed: repo.ref(bogies, bogies.functions.find((x) => x.name === fixed.name)!) });
        }
      }

      releases.push({ label, date: addDays(plan.firstDay, release * plan.everyDays), files: repo.files() });
      dated.push({ date: releases[release].date, order, step: { load: { repository: plan.name, label } } });
      if (story.waived && story.waived.repository === plan.name && story.waived.afterLabel === label) {
        dated.push({ date: releases[release].date, order, step: { waive: story.waived } });
      }
    }
    repositories.push({ name: plan.name, description: plan.description, cloneBudget: plan.cloneBudget, releases });
  }
  // one history for the whole company: loads in date order (the waiver right after its load)
  const steps = dated.map((d, i) => ({ ...d, i })).sort((a, b) => (a.date < b.date ? -1 : a.date > b.date ? 1 : a.order - b.order || a.i - b.i)).map((d) => d.step);
  return { repositories, steps, story: story as DemoStory };
}
