import { parseArgs } from 'node:util';
import { ConfigError, loadConfig } from '../lib/config';
import { createLogger } from '../lib/log/logger';
import { FleetFileError } from '../lib/register/fleetFile';
import { UsageError } from './usageError';

const HELP = `holdfast — fleet station-keeping analytics (advisory, after the fact)

Usage: holdfast <command> [options]     (or: npm run holdfast -- <command> …)

  start [--no-web]        run everything: store, broker, ingest, jobs, demo, web app
  migrate                 apply pending database migrations
  fleet import FILE       import a fleet register file (JSON or YAML, fleet-v1)
  ingest                  run one ingest worker (needs DATABASE_URL and MQTT_URL)
  jobs                    run the job scheduler (needs DATABASE_URL)
  jobs run --from DAY --to DAY
                          compute the daily figures of those days now, and wait
  token create --name NAME --role ROLE [--campaign KEY]
                          create a JSON API token (printed alone on the last line)
  token list | token revoke ID
                          list API tokens; revoke one (docs/api.md)
  user create --email E --name N --role ROLE [--organisation KEY]
                          create a user; the password is typed or piped on stdin
  user list | user disable --email E
                          list users; disable one and end its sessions
  campaign assign KEY --organisation ORG | campaign unassign KEY
                          give a campaign to a charterer's organisation, or take it away
  vessel credentials KEY [--revoke]
                          new MQTT credentials for a vessel, printed once
  broker export --out DIR write Mosquitto password, ACL and config files
  broker ingest-credentials
                          new MQTT credentials for the ingest workers, printed once
  flags evaluate [--day DAY | --from DAY --to DAY]
                          evaluate the trend flags of those days (default yesterday)
  flags ack|close|settings|webhook|deliver …
                          work through flags, settings, webhooks (docs/flags.md)
  help                    this text

Settings come from the environment; see README.md.`;

async function main(argv: string[]): Promise<void> {
  const { positionals, values } = parseArgs({
    args: argv,
    allowPositionals: true,
    options: {
      'no-web': { type: 'boolean', default: false },
      help: { type: 'boolean', short: 'h' },
      from: { type: 'string' },
      to: { type: 'string' },
      name: { type: 'string' },
      role: { type: 'string' },
      campaign: { type: 'string' },
      email: { type: 'string' },
      organisation: { type: 'string' },
      out: { type: 'string' },
      revoke: { type: 'boolean', default: false },
      day: { type: 'string' },
      by: { type: 'string' },
      note: { type: 'string' },
      reason: { type: 'string' },
      secret: { type: 'string' },
    },
  });
  const [command, ...rest] = positionals;
  if (!command || command === 'help' || values.help) {
    console.log(HELP);
    return;
  }
  const config = loadConfig();
  const log = createLogger(config.LOG_LEVEL, 'holdfast', undefined, config.LOG_FORMAT);
  // Each command loads only its own modules: a worker process should not
  // carry the web supervisor, the Prisma client or the demo publisher.
  switch (command) {
    case 'start':
      return (await import('./commands/start')).startCommand(config, log, { web: !values['no-web'] });
    case 'migrate':
      return (await import('./commands/services')).migrateCommand(config, log);
    case 'ingest':
      return (await import('./commands/services')).ingestCommand(config, log);
    case 'jobs':
      if (rest[0] === 'run') {
        if (!values.from || !values.to) throw new UsageError('usage: holdfast jobs run --from YYYY-MM-DD --to YYYY-MM-DD');
        return (await import('./commands/jobsRun')).jobsRunCommand(config, log, values.from, values.to);
      }
      return (await import('./commands/services')).jobsCommand(config, log);
    case 'fleet':
      if (rest[0] === 'import' && rest[1]) return (await import('./commands/fleetImport')).fleetImportCommand(config, log, rest[1]);
      throw new UsageError('usage: holdfast fleet import FILE');
    case 'token':
      return (await import('./commands/token')).tokenCommand(config, log, rest, values);
    case 'user':
      return (await import('./commands/user')).userCommand(config, log, rest, values);
    case 'campaign':
      return (await import('./commands/campaign')).campaignCommand(config, log, rest, values);
    case 'vessel':
      return (await import('./commands/vessel')).vesselCommand(config, log, rest, values);
    case 'broker':
      return (await import('./commands/broker')).brokerCommand(config, log, rest, values);
    case 'flags':
      return (await import('./commands/flags')).flagsCommand(config, log, rest, values);
    default:
      throw new UsageError(`unknown command "${command}"; try: holdfast help`);
  }
}


main(process.argv.slice(2)).catch((error: unknown) => {
  // Expected failures print one clear message; anything else shows its stack.
  if (error instanceof ConfigError || error instanceof UsageError) console.error(error.message);
  else if (error instanceof FleetFileError) console.error(error.message);
  else if (error instanceof Error && error.message.startsWith('Setting ')) console.error(error.message);
  else console.error(error instanceof Error ? (error.stack ?? error.message) : String(error));
  process.exit(error instanceof UsageError ? 2 : 1);
});
