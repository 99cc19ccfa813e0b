/**
 * The demo seeds, in order. Each one checks for itself that the database is
 * empty of what it adds, so seeding never writes over a user's data.
 */
import type { Knex } from 'knex';
import { seed as seedDemoWorkspace } from './01_demo_workspace';
import { seed as seedDemoUsers } from './02_demo_users';
import { seed as seedDemoScenarios } from './03_demo_scenarios';
import { seed as seedConsultantPortfolio } from './04_consultant_portfolio';
import { seed as seedPlansAndBilling } from './05_plans_and_billing';
import { seed as seedDemoRoom } from './06_demo_room';

const seeds: Array<(knex: Knex) => Promise<void>> = [seedDemoWorkspace, seedDemoUsers, seedDemoScenarios, seedConsultantPortfolio, seedPlansAndBilling, seedDemoRoom];

export async function runSeeds(knex: Knex): Promise<void> {
	for (const seed of seeds) await seed(knex);
}
