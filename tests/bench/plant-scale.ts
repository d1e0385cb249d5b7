/** Sizes of the generated Fennmoor plant: full size by hand, a reduced one for CI. */
export interface PlantScale {
  name: "full" | "ci";
  systems: number;
  recipes: number;
  versionsPerRecipe: number;
  /** The busy recipe's traced parameter changes at every one of its versions. */
  busyVersions: number;
  changeRequests: number;
  testRuns: number;
  samplesPerRun: number;
  auditEvents: number;
  documents: number;
  partFamilies: number;
  /** Requests per point of the read endpoints: this many per connection, at least readMinimum. */
  readsPerConnection: number;
  readMinimum: number;
  /** The same for the slow endpoints (signing, PDF). */
  slowPerConnection: number;
  slowMinimum: number;
  /** Connections at which every endpoint is measured; CI leaves out 50 to stay within a few minutes. */
  connections: number[];
  /** Connections at which the 40-page PDF is measured (CI measures one at a time only: each takes seconds on 2 cores). */
  pdfConnections: number[];
  /** PDFs per point: one per connection, at least this many (each renders for seconds). */
  pdfMinimum: number;
}

export const SCALES: Record<PlantScale["name"], PlantScale> = {
  full: {
    name: "full",
    systems: 20,
    recipes: 500,
    versionsPerRecipe: 10,
    busyVersions: 30,
    changeRequests: 20_000,
    testRuns: 200_000,
    samplesPerRun: 2,
    auditEvents: 1_000_000,
    documents: 10_000,
    partFamilies: 100,
    readsPerConnection: 10,
    readMinimum: 200,
    slowPerConnection: 3,
    slowMinimum: 10,
    connections: [1, 10, 50],
    pdfConnections: [1, 10, 50],
    pdfMinimum: 3,
  },
  ci: {
    name: "ci",
    systems: 5,
    recipes: 50,
    versionsPerRecipe: 10,
    busyVersions: 30,
    changeRequests: 2_000,
    testRuns: 20_000,
    samplesPerRun: 2,
    auditEvents: 100_000,
    documents: 1_000,
    partFamilies: 20,
    readsPerConnection: 2,
    readMinimum: 20,
    slowPerConnection: 1,
    slowMinimum: 2,
    connections: [1, 10],
    pdfConnections: [1],
    pdfMinimum: 2,
  },
};

/**
 * `--scale=ci` or BENCH_SCALE=ci picks the reduced size; full size otherwise.
 * `--points=ci` keeps the data of the chosen size but measures only the CI's
 * points (1 and 10 connections, few requests): a full-size plant in minutes.
 */
export function scaleFromArgs(argv: string[], env: NodeJS.ProcessEnv): PlantScale {
  const option = (name: string) =>
    argv.find((a) => a.startsWith(`--${name}=`))?.slice(name.length + 3);
  const arg = option("scale") ?? env.BENCH_SCALE ?? "full";
  if (arg !== "full" && arg !== "ci")
    throw new Error(`Unknown scale "${arg}": use --scale=full or --scale=ci.`);
  const points = option("points") ?? env.BENCH_POINTS ?? arg;
  if (points !== "full" && points !== "ci")
    throw new Error(`Unknown points "${points}": use --points=full or --points=ci.`);
  const {
    readsPerConnection,
    readMinimum,
    slowPerConnection,
    slowMinimum,
    connections,
    pdfConnections,
    pdfMinimum,
  } = SCALES[points];
  return {
    ...SCALES[arg],
    readsPerConnection,
    readMinimum,
    slowPerConnection,
    slowMinimum,
    connections,
    pdfConnections,
    pdfMinimum,
  };
}
