/** Every object a person uploads or we derive from it lives under their own prefix. */
export const userPrefix = (userId: string) => `users/${userId}/`;

export const isUsersKey = (userId: string, key: string) => key.startsWith(userPrefix(userId)) && !key.includes('..');
