import { z } from 'zod';
import { ROLES } from '../../shared/accounts/roles';

/** An e-mail address as we store it: trimmed, lower case, at most 254 characters (RFC 5321). */
export const emailSchema = z.string().trim().toLowerCase().max(254, 'At most 254 characters').pipe(z.email('Not an e-mail address'));

/** bcrypt reads only the first 72 bytes of a password, so longer ones are refused, not cut. */
const BCRYPT_MAX_BYTES = 72;
/** A new password: 10+ characters (NIST SP 800-63B asks at least 8) and at most 72 bytes. */
export const newPasswordSchema = z
  .string()
  .min(10, 'Use at least 10 characters')
  .max(BCRYPT_MAX_BYTES, `Use at most ${BCRYPT_MAX_BYTES} characters`)
  .refine((password) => Buffer.byteLength(password, 'utf8') <= BCRYPT_MAX_BYTES, `Use at most ${BCRYPT_MAX_BYTES} bytes`);

/** A display name: what people call the person or device. */
export const nameSchema = z.string().trim().min(1, 'Required').max(200, 'At most 200 characters');
export const deviceNameSchema = z.string().trim().min(1, 'Required').max(100, 'At most 100 characters');
export const labNameSchema = z.string().trim().min(1, 'Required').max(200, 'At most 200 characters');
export const roleSchema = z.enum(ROLES);

/** An opaque token we made: 32 random bytes in base64url are 43 characters. */
export const opaqueTokenSchema = z.string().regex(/^[A-Za-z0-9_-]{43}$/, 'Not a token this server made');

export const loginBody = z.strictObject({
  email: emailSchema,
  password: z.string().min(1, 'Required').max(200, 'At most 200 characters'),
  deviceId: z.uuid('Not a UUID').optional(),
  deviceName: deviceNameSchema.optional(),
});
export type LoginInput = z.infer<typeof loginBody>;

export const refreshBody = z.strictObject({ refreshToken: opaqueTokenSchema });
export const forgotPasswordBody = z.strictObject({ email: emailSchema });
export const linkBody = z.strictObject({ token: opaqueTokenSchema });
export const setPasswordBody = z.strictObject({ token: opaqueTokenSchema, password: newPasswordSchema });
export const noQuery = z.strictObject({});
