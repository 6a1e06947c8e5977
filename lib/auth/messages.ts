/** One message for every failed sign-in, so nobody can learn which e-mail addresses exist. */
export const GENERIC_SIGN_IN_FAILURE = "That e-mail and password do not match an active account.";
