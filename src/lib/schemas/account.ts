import { z } from 'zod';

export const emailField = z
	.string()
	.trim()
	.min(1, 'Enter your e-mail address.')
	.max(254, 'That address is too long.')
	.email('Enter an e-mail address like name@example.org.');

export const nameField = z.string().trim().min(1, 'Enter your name.').max(120, 'Use at most 120 characters.');

// Length and common-password rules live in the password module; this only bounds the input.
export const passwordField = z.string().min(1, 'Enter a password.').max(1024, 'That password is too long.');

export const signUpForm = z.object({
	name: nameField,
	email: emailField,
	password: passwordField,
	workspaceName: z.string().trim().max(120, 'Use at most 120 characters.').optional().default('')
});

export const signInForm = z.object({ email: emailField, password: passwordField, next: z.string().optional() });

export const forgotPasswordForm = z.object({ email: emailField });

export const resetPasswordForm = z.object({ password: passwordField });

export const changePasswordForm = z.object({ currentPassword: passwordField, newPassword: passwordField });

export const renameForm = z.object({ name: nameField });

export const inviteForm = z.object({
	email: emailField,
	role: z.enum(['owner', 'analyst', 'viewer'], { message: 'Choose owner, analyst or viewer.' })
});
