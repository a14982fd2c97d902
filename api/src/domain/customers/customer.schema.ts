import { z } from 'zod';

import { cursorPageSchemaOf, cursorPageShape, refineCursorPage } from '../paging/page.schema.js';

const NameSchema = z.string().trim().min(1, { error: 'is required' }).max(120);
const OptionalEmailSchema = z
  .string()
  .trim()
  .max(254)
  .pipe(z.email({ error: 'must be an e-mail address' }))
  .transform((email) => email.toLowerCase())
  .nullable();
const OptionalPhoneSchema = z
  .string()
  .trim()
  .max(40)
  .regex(/^[0-9+()\-.\s]*$/, { error: 'must contain digits, spaces and + ( ) - . only' })
  .nullable();
const NotesSchema = z.string().max(2000).nullable();

export const CreateCustomerSchema = z.object({
  name: NameSchema,
  email: OptionalEmailSchema.optional(),
  phone: OptionalPhoneSchema.optional(),
  notes: NotesSchema.optional(),
});
export type CreateCustomerInput = z.infer<typeof CreateCustomerSchema>;

export const UpdateCustomerSchema = CreateCustomerSchema.partial().refine((v) => Object.keys(v).length > 0, {
  error: 'nothing to change',
});
export type UpdateCustomerInput = z.infer<typeof UpdateCustomerSchema>;

/** `GET /api/customers`: `q` searches name and e-mail; by name, a page at a time (`page` or `cursor`, `pageSize`). */
export const CustomerListQuerySchema = refineCursorPage(z.object({ q: z.string().trim().max(120).optional(), ...cursorPageShape }));
export type CustomerListQuery = z.infer<typeof CustomerListQuerySchema>;

export const CustomerResponseSchema = z.object({
  id: z.string(),
  name: z.string(),
  email: z.string().nullable(),
  phone: z.string().nullable(),
  notes: z.string().nullable(),
  createdAt: z.string(),
  updatedAt: z.string(),
});
export type CustomerResponse = z.infer<typeof CustomerResponseSchema>;

export const CustomerPageSchema = cursorPageSchemaOf(CustomerResponseSchema);
