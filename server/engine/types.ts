// The engine's request and result types and its vocabulary live in one import-free module that the engine, the shared
// code and the client all read (shared/engine/contract.ts); the engine re-exports them from here.
export * from '../../shared/engine/contract'
