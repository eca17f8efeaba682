import fs from 'node:fs';
import path from 'node:path';
import crypto from 'node:crypto';

export interface LocalSecrets {
  sessionSecret: string;
  databasePassword: string;
  stripeWebhookSecret: string;
}

/** Random secrets for the local stack, made once per data folder and kept beside the data. */
export function loadLocalSecrets(dataDir: string): LocalSecrets {
  const file = path.join(dataDir, 'local-secrets.json');
  if (fs.existsSync(file)) return JSON.parse(fs.readFileSync(file, 'utf8')) as LocalSecrets;
  const secrets: LocalSecrets = {
    sessionSecret: crypto.randomBytes(32).toString('hex'),
    databasePassword: crypto.randomBytes(18).toString('hex'),
    stripeWebhookSecret: `whsec_${crypto.randomBytes(24).toString('hex')}`,
  };
  fs.mkdirSync(dataDir, { recursive: true });
  fs.writeFileSync(file, JSON.stringify(secrets, null, 2), { mode: 0o600 });
  return secrets;
}
