import type { MethodConfig, MethodName } from './types.ts';

/** Writes every method out in full: a bare name becomes `{ name, label: name }`. */
export function resolveMethods(
  methods: readonly ({ name: string; label?: string; path?: string } | string)[],
): MethodConfig[] {
  return methods.map((entry) => {
    const method = typeof entry === 'string' ? { name: entry } : entry;
    const out: MethodConfig = {
      name: method.name as MethodName,
      label: method.label ?? method.name,
    };
    if (method.path !== undefined) out.path = method.path;
    return out;
  });
}
