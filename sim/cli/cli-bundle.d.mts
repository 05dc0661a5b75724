// Types of sim/cli/cli-bundle.mjs (plain JavaScript, since it runs before TypeScript can load).

/** The checkout the launcher belongs to. */
export const CHECKOUT_ROOT: string;
/** node_modules/.cache/pliant-cli in the checkout, or PLIANT_CLI_CACHE. */
export function cliCacheDir(env?: Record<string, string | undefined>): string;
/** SHA-256 (32 hex digits) over the recipe and each input's relative path and bytes; throws if an input is unreadable. */
export function bundleKey(root: string, inputs: readonly string[]): string;
/** The current bundle's entry module if its sources are unchanged, else undefined. */
export function currentBundle(root: string, cacheDir: string): string | undefined;
/** Builds the bundle of the checkout at `root` into `cacheDir`; returns its entry module's path. */
export function buildBundle(root: string, cacheDir: string): Promise<string>;
/** The current bundle, built first if needed; undefined where it cannot be built. */
export function bundledCliEntry(root?: string, cacheDir?: string): Promise<string | undefined>;
/** Hands the prebuilt scenario checker and episode worker of the bundle at `entryPath` to the imported bundle. */
export function connectPrebuiltParts(bundle: { usePrebuiltScenarioChecker(load: () => unknown): void; usePrebuiltEpisodeWorker(url: URL): void }, entryPath: string): void;
