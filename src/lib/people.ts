/**
 * What an admin sends to invite a person and to set their sites: run by the server
 * (src/server/services/users.ts) and by the people page's form alike.
 */
import { z } from 'zod';
import { ROLES } from './roles';

/** A person's sites: every site ('all', sites added later included) or a list of site ids. */
export const SitesInput = z.union([z.literal('all'), z.array(z.string().uuid('A site id is a UUID.')).max(1000)]);

export const InviteInput = z.object({
  name: z
    .string()
    .trim()
    .min(1, 'Give the person a name.')
    .max(120, 'A name has at most 120 characters.')
    .regex(/^[^\u0000-\u001f\u007f]*$/, 'A name has no control characters.'),
  email: z.string().trim().toLowerCase().max(254, 'An e-mail address has at most 254 characters.').email('That does not look like an e-mail address.'),
  role: z.enum(ROLES),
  /** Omitted: every site on a one-site install; on a larger one, none until an admin lists them. */
  sites: SitesInput.optional(),
});
