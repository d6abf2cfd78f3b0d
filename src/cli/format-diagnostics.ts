// Moved to render/; kept so existing imports keep working.
export * from '../render/format-diagnostics.ts';
