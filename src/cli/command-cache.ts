// Moved to the engine; kept so existing imports keep working.
export * from '../engine/command-cache.ts';
