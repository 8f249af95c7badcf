import { databaseTarget, describeTarget } from './support/database-target.ts';

/** Runs once before all test files: says where the database tests run. */
export default function setup(): void {
  console.log(describeTarget(databaseTarget()));
}
