/**
 * Loads the BUILT functions bundle (dist/functions.js, made by `npm run
 * build:addin`, which `npm test` runs first) into this process, with the
 * runtime's `CustomFunctions` object supplied by the test: an office-addin-mock
 * object holding `associate` (which records each registered function) and
 * `Error` (which records each Excel error the functions build).
 */
import * as fs from 'fs';
import * as path from 'path';
import { OfficeMockObject } from 'office-addin-mock';

export const BUNDLE = path.resolve(__dirname, '..', '..', 'dist', 'functions.js');

/** The error codes of CustomFunctions.ErrorCode (Office documentation, CustomFunctions.ErrorCode enum). */
export const ERROR_CODES = {
  divisionByZero: '#DIV/0!',
  invalidName: '#NAME?',
  invalidNumber: '#NUM!',
  invalidReference: '#REF!',
  invalidValue: '#VALUE!',
  notAvailable: '#N/A',
  nullReference: '#NULL!',
};

/** An Excel error as the mock runtime builds it. */
export class MockExcelError {
  constructor(
    readonly code: string,
    readonly message?: string,
  ) {}
}

// eslint-disable-next-line @typescript-eslint/no-explicit-any
export type Registered = Map<string, (...args: any[]) => any>;

export interface LoadedBundle {
  functions: Registered;
  /** Every `associate` call, in order. */
  associations: string[];
  /** The mock `CustomFunctions` object the bundle used. */
  runtime: OfficeMockObject & Record<string, unknown>;
}

export function loadFunctionsBundle(): LoadedBundle {
  if (!fs.existsSync(BUNDLE)) throw new Error(`${BUNDLE} is missing: run \`npm run build:addin\` (npm test does it first)`);
  const functions: Registered = new Map();
  const associations: string[] = [];
  const runtime = new OfficeMockObject({
    associate: (id: string, fn: (...args: unknown[]) => unknown) => {
      associations.push(id);
      functions.set(id, fn);
    },
    Error: MockExcelError,
  }) as OfficeMockObject & Record<string, unknown>;
  // Plain strings, not mock properties: the runtime's enum needs no load/sync.
  runtime.ErrorCode = ERROR_CODES;
  (globalThis as Record<string, unknown>).CustomFunctions = runtime;
  // Run in this test's own global context (Jest's), where CustomFunctions now lives.
  new Function(`${fs.readFileSync(BUNDLE, 'utf8')}\n//# sourceURL=${BUNDLE}`)();
  return { functions, associations, runtime };
}

/** The error a function threw or rejected with (fails the test when it returned a value). */
export async function errorOf(f: () => unknown): Promise<MockExcelError> {
  try {
    await f();
  } catch (e) {
    if (e instanceof MockExcelError) return e;
    throw new Error(`expected an Excel error, got ${String(e)}`);
  }
  throw new Error('expected an Excel error, got a value');
}
