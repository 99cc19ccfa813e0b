import type { Knex } from 'knex';

/**
 * Every change to what the workbench's cached reads hold (projects, their
 * scenarios, stored results and uploads, and the names of the people shown
 * beside them) is announced on the `tidewright_changes` channel, whoever
 * makes it: the app, a worker, a script or a hand-typed statement. The
 * payload names the project (`project:<id>`), or `all` when a person's name
 * changes. PostgreSQL delivers a notification at commit, once per distinct
 * payload per transaction, and never for a rolled-back change. Read by
 * src/lib/server/db/change-feed.ts.
 */
export async function up(knex: Knex): Promise<void> {
	await knex.raw(`
		create function tidewright_project_changed() returns trigger language plpgsql as $$
		declare
			changed_project uuid;
		begin
			if tg_table_name = 'projects' then
				changed_project := coalesce(new.id, old.id);
			elsif tg_table_name = 'scenario_results' then
				select project_id into changed_project from scenarios where id = coalesce(new.scenario_id, old.scenario_id);
			else
				changed_project := coalesce(new.project_id, old.project_id);
			end if;
			if changed_project is not null then
				perform pg_notify('tidewright_changes', 'project:' || changed_project);
			end if;
			-- A row moved to another project changes that one too (nested: a projects row has no project_id).
			if tg_op = 'UPDATE' and tg_table_name in ('scenarios', 'uploads') then
				if old.project_id is distinct from new.project_id then
					perform pg_notify('tidewright_changes', 'project:' || old.project_id);
				end if;
			end if;
			return null;
		end
		$$;

		create function tidewright_names_changed() returns trigger language plpgsql as $$
		begin
			perform pg_notify('tidewright_changes', 'all');
			return null;
		end
		$$;
	`);
	for (const table of ['projects', 'scenarios', 'scenario_results', 'uploads']) {
		await knex.raw(`create trigger ${table}_announce_change after insert or update or delete on ${table} for each row execute function tidewright_project_changed()`);
	}
	await knex.raw(`create trigger users_announce_name_change after update of name on users for each row when (old.name is distinct from new.name) execute function tidewright_names_changed()`);
}

export async function down(knex: Knex): Promise<void> {
	for (const table of ['projects', 'scenarios', 'scenario_results', 'uploads']) {
		await knex.raw(`drop trigger if exists ${table}_announce_change on ${table}`);
	}
	await knex.raw(`drop trigger if exists users_announce_name_change on users`);
	await knex.raw(`drop function if exists tidewright_project_changed(); drop function if exists tidewright_names_changed();`);
}
