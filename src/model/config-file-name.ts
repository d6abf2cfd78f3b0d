// The configuration file's name, on its own so that the command line's help can name it without loading the
// configuration reader.
export const configFileName = 'stepwright.config.yaml';
