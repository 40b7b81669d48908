(function () {
  "use strict";
  // Sorting and filtering of the file index.
  var index = document.getElementById("file-index");
  if (index) {
    var heads = index.querySelectorAll("thead th");
    heads.forEach(function (th, col) {
      th.tabIndex = 0;
      function sort() {
        var ascending = th.getAttribute("aria-sort") !== "ascending";
        heads.forEach(function (other) { other.setAttribute("aria-sort", "none"); });
        th.setAttribute("aria-sort", ascending ? "ascending" : "descending");
        var numeric = th.dataset.type === "num";
        var body = index.tBodies[0];
        var rows = Array.prototype.slice.call(body.rows);
        rows.sort(function (a, b) {
          var x = a.cells[col].dataset.value, y = b.cells[col].dataset.value;
          var c = numeric ? parseFloat(x) - parseFloat(y) : x.localeCompare(y);
          return ascending ? c : -c;
        });
        rows.forEach(function (r) { body.appendChild(r); });
      }
      th.addEventListener("click", sort);
      th.addEventListener("keydown", function (e) { if (e.key === "Enter" || e.key === " ") { e.preventDefault(); sort(); } });
    });
    var filter = document.getElementById("filter");
    if (filter) {
      filter.addEventListener("input", function () {
        var words = filter.value.toLowerCase().split(/\s+/).filter(Boolean);
        Array.prototype.forEach.call(index.tBodies[0].rows, function (row) {
          var text = (row.dataset.filter || row.textContent).toLowerCase();
          var keep = words.every(function (w) { return text.indexOf(w) >= 0; });
          row.classList.toggle("hidden", !keep);
        });
      });
    }
  }

  // Moving between TODOs: n/j next, p/k previous; links in the TODO list highlight their row.
  var todos = Array.prototype.slice.call(document.querySelectorAll(".row.todo-row"));
  var current = -1;
  function show(element) {
    if (!element) { return; }
    var row = element.classList.contains("row") ? element : element.closest(".notes") && element.closest(".notes").previousElementSibling;
    row = row || element;
    for (var p = row.parentElement; p; p = p.parentElement) { if (p.tagName === "DETAILS") { p.open = true; } }
    document.querySelectorAll(".row.current").forEach(function (r) { r.classList.remove("current"); });
    row.classList.add("current");
    row.scrollIntoView({ block: "center" });
    current = todos.indexOf(row);
  }
  function fromHash() {
    var id = decodeURIComponent(location.hash.slice(1));
    if (id && id.indexOf("todo-") === 0) { show(document.getElementById(id)); }
  }
  window.addEventListener("hashchange", fromHash);
  document.querySelectorAll("#todo-list a").forEach(function (a) {
    a.addEventListener("click", function () { show(document.getElementById(a.getAttribute("href").slice(1))); });
  });
  document.addEventListener("keydown", function (e) {
    if (e.ctrlKey || e.metaKey || e.altKey || !todos.length) { return; }
    var t = e.target;
    if (t && (t.tagName === "INPUT" || t.tagName === "TEXTAREA" || t.isContentEditable)) { return; }
    var step = (e.key === "n" || e.key === "j") ? 1 : (e.key === "p" || e.key === "k") ? -1 : 0;
    if (!step) { return; }
    e.preventDefault();
    var next = current < 0 ? (step > 0 ? 0 : todos.length - 1) : (current + step + todos.length) % todos.length;
    show(todos[next]);
    if (todos[next].id) { history.replaceState(null, "", "#" + todos[next].id); }
  });
  fromHash();
})();
