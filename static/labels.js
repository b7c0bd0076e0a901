// bondgap chart labels: place point labels where they overlap no other label, no marker and
// nothing already drawn (titles, legend, toolbar), inside the plot area. Shared by the compare,
// compound and finder charts. window.bondgapLabels.place(el, labels, options) returns plotly
// annotations; window.bondgapLabels.attach(el, build) redraws them when the chart is resized.
"use strict";

(function () {
  const FONT = "system-ui, sans-serif";
  const PAD = 3;  // px around a label's text (plotly's borderpad plus a little air)
  let canvas = null;

  function textWidth(text, size) {
    canvas = canvas || document.createElement("canvas");
    const ctx = canvas.getContext("2d");
    ctx.font = size + "px " + FONT;
    return ctx.measureText(text).width;
  }

  function overlaps(a, b) {
    return a.x0 < b.x1 && b.x0 < a.x1 && a.y0 < b.y1 && b.y0 < a.y1;
  }

  // Offsets of a label's centre from its point, nearest first: the eight neighbours, then
  // rings further out (drawn with a leader line).
  function offsets(w, h, r) {
    const dx = r + w / 2 + 2, dy = r + h / 2 + 1;
    const near = [[0, -dy], [0, dy], [dx, 0], [-dx, 0], [dx, -dy], [-dx, -dy], [dx, dy],
                  [-dx, dy]];
    const far = [];
    [28, 44, 64, 90].forEach(function (ring) {
      for (let k = 0; k < 16; k += 1) {
        const angle = -Math.PI / 2 + (k * Math.PI) / 8;
        far.push([Math.cos(angle) * (ring + w / 2), Math.sin(angle) * (ring + h / 2)]);
      }
    });
    return { near: near, far: far };
  }

  // The pixel box of a drawn SVG element, in the chart's own coordinates.
  function boxOf(node, origin) {
    const b = node.getBoundingClientRect();
    if (!b.width || !b.height) return null;
    return { x0: b.left - origin.left, x1: b.right - origin.left,
             y0: b.top - origin.top, y1: b.bottom - origin.top };
  }

  function drawnBoxes(el) {
    const origin = el.getBoundingClientRect();
    const selectors = [".g-xtitle", ".g-ytitle", ".legend", ".modebar",
                       ".annotation-text-g"];
    const boxes = [];
    selectors.forEach(function (sel) {
      el.querySelectorAll(sel).forEach(function (node) {
        const box = boxOf(node, origin);
        if (box) boxes.push(box);
      });
    });
    return boxes;
  }

  /**
   * Annotations for `labels`, each placed next to its point without overlaps.
   * labels: [{x, y, text, r (marker radius, px), colour}]; options: {points: [{x, y, r}]
   * markers a label must not cover, soft: [{x, y, r}] markers it should rather not cover,
   * size: font size}. Labels that fit nowhere are left out (their points keep hover text).
   */
  function place(el, labels, options) {
    const full = el._fullLayout;
    if (!full || !full._size) return [];
    const size = full._size;
    const xa = full.xaxis, ya = full.yaxis;
    const px = function (x) { return size.l + ((x - xa.range[0]) / (xa.range[1] - xa.range[0])) * size.w; };
    const py = function (y) { return size.t + (1 - (y - ya.range[0]) / (ya.range[1] - ya.range[0])) * size.h; };
    const fontSize = options.size || 11;
    const area = { x0: size.l, x1: size.l + size.w, y0: size.t, y1: size.t + size.h };
    const hard = drawnBoxes(el);
    const dot = function (p) {
      const r = p.r || 5;
      return { x0: px(p.x) - r, x1: px(p.x) + r, y0: py(p.y) - r, y1: py(p.y) + r };
    };
    const points = (options.points || []).map(dot);
    const soft = (options.soft || []).map(dot);
    const taken = [];
    const annotations = [];
    labels.forEach(function (label) {
      const x = px(label.x), y = py(label.y);
      if (x < area.x0 || x > area.x1 || y < area.y0 || y > area.y1) return;
      const w = textWidth(label.text, fontSize) + 2 * PAD, h = fontSize * 1.25 + 2 * PAD;
      const ring = offsets(w, h, label.r || 5);
      let best = null;
      ring.near.concat(ring.far).forEach(function (off, index) {
        const box = { x0: x + off[0] - w / 2, x1: x + off[0] + w / 2,
                      y0: y + off[1] - h / 2, y1: y + off[1] + h / 2 };
        if (box.x0 < area.x0 || box.x1 > area.x1 || box.y0 < area.y0 || box.y1 > area.y1) return;
        const blocked = taken.concat(hard, points).some(function (b) { return overlaps(box, b); });
        if (blocked) return;
        const cost = index + 6 * soft.filter(function (b) { return overlaps(box, b); }).length;
        if (!best || cost < best.cost) best = { cost: cost, off: off, box: box, near: index < 8 };
      });
      if (!best) return;
      taken.push(best.box);
      annotations.push({
        x: label.x, y: label.y, xref: "x", yref: "y", text: label.text,
        showarrow: true, ax: best.off[0], ay: best.off[1], axref: "pixel", ayref: "pixel",
        arrowhead: 0, arrowwidth: 1, standoff: label.r || 5,
        arrowcolor: best.near ? "rgba(0,0,0,0)" : "#8b93a1",
        font: { size: fontSize, color: label.colour || "#1f2733" },
        bgcolor: "rgba(255,255,255,0.8)", borderpad: 1, name: "placed",
      });
    });
    return annotations;
  }

  /**
   * Place labels after the chart is drawn and again when its size changes.
   * build(el) returns the labels' annotations (from `place`); `fixed` are the chart's own.
   */
  function attach(el, fixed, build) {
    let shape = "";
    const redo = function () {
      const s = el._fullLayout && el._fullLayout._size;
      const now = s ? [s.l, s.t, s.w, s.h].join(",") : "";
      if (!now || now === shape) return;
      shape = now;
      Plotly.relayout(el, { annotations: fixed }).then(function () {
        return Plotly.relayout(el, { annotations: fixed.concat(build(el)) });
      });
    };
    redo();
    el.on("plotly_afterplot", function () { window.setTimeout(redo, 0); });
  }

  window.bondgapLabels = { place: place, attach: attach };
})();
