/** Storage: run directories, manifests, and chain files in Arrow IPC stream format. */
export { ChainWriter, type ChainSink, type ChainWriterOptions, type ResumeReport } from './chainWriter.js';
export { ChainFile, type ChainDraws, type ChainOptions } from './chainReader.js';
export { chainSchema, CHAIN_FORMAT, LOG_COLUMNS, type ChainFileHeader } from './chainSchema.js';
export { RunChainWriter, readRunChains, type RunDraws, type RunChainWriterOptions } from './runChains.js';
export { readManifest, writeManifest, runManifestSchema, MANIFEST_FILE, RUN_FORMAT, type RunManifest } from './manifest.js';
export { createRunDirectory, openRunDirectory, newRunId, RUN_LAYOUT, type RunDirectoryMode } from './runDirectory.js';
export { readStarsTable, type StarsTable } from './starsTable.js';
