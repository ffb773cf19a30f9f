/**
 * The people the local fake identity provider offers on its sign-in page
 * (config/personas.json). All invented. A persona is what the organisation's
 * directory says about someone; whether Cairn lets them in is Cairn's decision.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { z } from 'zod';
import { findRepoRoot } from '../../config/load-config.js';
import { ROLES } from '../../users/roles.js';

const personaSchema = z
  .object({
    key: z.string().regex(/^[a-z][a-z0-9_]*$/),
    email: z.email(),
    displayName: z.string().min(1),
    role: z.enum(ROLES),
    practices: z.array(z.string().min(1)),
    /** Shown on the picker: what to expect when signing in as this persona */
    note: z.string().min(1),
  })
  .strict();

export type Persona = z.infer<typeof personaSchema>;

const fileSchema = z
  .object({ $comment: z.string().optional(), personas: z.array(personaSchema).min(1) })
  .strict();

export function personasFile(root = findRepoRoot()): string {
  return join(root, 'config', 'personas.json');
}

export function loadPersonas(file = personasFile()): Persona[] {
  const result = fileSchema.safeParse(JSON.parse(readFileSync(file, 'utf8')));
  if (!result.success) {
    throw new Error(
      `${file} is not valid: ${result.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`).join('; ')}`,
    );
  }
  const keys = new Set<string>();
  for (const persona of result.data.personas) {
    if (keys.has(persona.key)) throw new Error(`${file}: persona key ${persona.key} appears twice`);
    keys.add(persona.key);
  }
  return result.data.personas;
}
