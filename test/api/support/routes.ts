import type { Router } from 'express';

export interface MountedRoute {
  readonly method: string;
  readonly path: string;
}

/** Every route mounted on the API router (method in lower case, Express path). */
export function mountedRoutes(router: Router): MountedRoute[] {
  const out: MountedRoute[] = [];
  for (const layer of router.stack as Array<{
    route?: { path: string; methods: Record<string, boolean> };
  }>) {
    if (!layer.route) continue;
    for (const [method, on] of Object.entries(layer.route.methods)) {
      if (on && method !== '_all') out.push({ method, path: layer.route.path });
    }
  }
  return out;
}
