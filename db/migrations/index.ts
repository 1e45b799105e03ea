import type { Migration } from './_shared';
import { migration as m0001 } from './20261202-0001-auth';
import { migration as m0002 } from './20261202-0002-feedstocks';
import { migration as m0003 } from './20261202-0003-trials';
import { migration as m0004 } from './20261202-0004-evidence';
import { migration as m0005 } from './20261202-0005-verdicts';
import { migration as m0006 } from './20261202-0006-mail-audit';
import { migration as m0101 } from './20261202-0101-rate-limits';
import { migration as m0801 } from './20261202-0801-mail-delivery';

/** Every migration in order. Listed statically so the app, the CLI and tests load the same set. */
export const MIGRATIONS: Migration[] = [m0001, m0002, m0003, m0004, m0005, m0006, m0101, m0801];
