export function serverNodeArgs(env?: NodeJS.ProcessEnv): string[]
export function serverEnv(env?: NodeJS.ProcessEnv): NodeJS.ProcessEnv
