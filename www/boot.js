// Runs before first paint (classic script in <head>): apply the saved night mode so the
// page never flashes white or non-red. External file because the CSP forbids inline script.
(function () {
  var night = false;
  try { night = localStorage.getItem('nightfield.night') === '1'; } catch (e) { /* storage blocked */ }
  document.documentElement.dataset.night = night ? '1' : '0';
})();
