// jsdom has no layout and no ResizeObserver; Svelte's bind:clientWidth needs the constructor to
// exist. Components under test then keep their unmeasured (server-rendered) size.
class NoLayoutResizeObserver {
	observe() {}
	unobserve() {}
	disconnect() {}
}
globalThis.ResizeObserver ??= NoLayoutResizeObserver as unknown as typeof ResizeObserver;
