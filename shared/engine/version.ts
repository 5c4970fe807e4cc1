/** Bumped whenever a formula or a default changes, so saved sheets record what computed them. */
export const ENGINE_VERSION = '1.5.1'
