// Layout check of SVG pictures, run by a browser on a page that embeds each picture inline in
// a <div class="case" data-name="...">. For every picture it measures each <text> as the
// browser laid it out (getBoundingClientRect, after transforms, in the picture's own units)
// and reports every text that leaves the picture (viewBox) and every two texts whose boxes
// intersect, by more than kTolerance in both directions. The result, one entry per picture,
// goes as JSON into <pre id="result">, which the test reads from the dumped DOM.
'use strict';
(function () {
  const kTolerance = 0.5;  // user units (pixels of the picture)
  const round = (v) => Math.round(v * 10) / 10;
  const results = [];
  for (const holder of document.querySelectorAll('div.case')) {
    const entry = { name: holder.dataset.name, texts: 0, widest: 0, problems: [] };
    results.push(entry);
    const svg = holder.querySelector('svg');
    if (!svg) {
      entry.problems.push('no <svg> element');
      continue;
    }
    const view = svg.viewBox.baseVal;
    const frame = svg.getBoundingClientRect();
    if (!view || view.width <= 0 || view.height <= 0 || frame.width <= 0 || frame.height <= 0) {
      entry.problems.push('the picture has no viewBox or no size');
      continue;
    }
    const sx = view.width / frame.width;
    const sy = view.height / frame.height;
    const boxes = [];
    for (const text of svg.querySelectorAll('text')) {
      const r = text.getBoundingClientRect();
      const box = {
        text: text.textContent,
        x0: view.x + (r.left - frame.left) * sx,
        x1: view.x + (r.right - frame.left) * sx,
        y0: view.y + (r.top - frame.top) * sy,
        y1: view.y + (r.bottom - frame.top) * sy,
      };
      if (box.text.trim() === '') continue;
      boxes.push(box);
      entry.widest = Math.max(entry.widest, box.x1 - box.x0);
      const where = `[${round(box.x0)}, ${round(box.x1)}] x [${round(box.y0)}, ${round(box.y1)}]`;
      if (box.x0 < view.x - kTolerance || box.y0 < view.y - kTolerance ||
          box.x1 > view.x + view.width + kTolerance || box.y1 > view.y + view.height + kTolerance) {
        entry.problems.push(`"${box.text}" at ${where} leaves the picture ` +
                            `(${view.width} x ${view.height})`);
      }
    }
    entry.texts = boxes.length;
    for (let i = 0; i < boxes.length; ++i) {
      for (let j = i + 1; j < boxes.length; ++j) {
        const a = boxes[i];
        const b = boxes[j];
        const dx = Math.min(a.x1, b.x1) - Math.max(a.x0, b.x0);
        const dy = Math.min(a.y1, b.y1) - Math.max(a.y0, b.y0);
        if (dx > kTolerance && dy > kTolerance) {
          entry.problems.push(`"${a.text}" and "${b.text}" overlap by ${round(dx)} x ` +
                              `${round(dy)} px near (${round(Math.max(a.x0, b.x0))}, ` +
                              `${round(Math.max(a.y0, b.y0))})`);
        }
      }
    }
  }
  document.getElementById('result').textContent = JSON.stringify(results);
})();
