// Browser shell. Placeholder until the app issue lands: shows what Taperline is and the cautions.
const root = document.getElementById('app')!;
root.innerHTML = `<main style="max-width:44rem;margin:3rem auto;line-height:1.5">
<h1>Taperline</h1>
<p>Map-view synthesis of rifted-margin depth grids. The map application is being built; the core
(readers, grid model, demo scenario) and the command-line tool run today.</p>
<p><strong>Caution:</strong> results are interpretations of the input grids and parameters. Decisions on
licences, surveys and drilling belong to qualified professionals and the local rules that govern them.</p>
</main>`;
(window as unknown as { __taperlineReady: boolean }).__taperlineReady = true;
