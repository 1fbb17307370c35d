// Site and time panel: coordinates, the site's own time zone, the site clock, event hours.
import { allZones, isValidZone, deviceZone, zonedToUtcMs, utcToZoned, eventHours, siteLabel } from './time.js';

const $ = (id) => document.getElementById(id);

export function initSiteUi(app) {
  const form = $('site-form');
  const tz = $('tz');
  const zones = allZones();
  tz.replaceChildren(...zones.map((z) => { const o = document.createElement('option'); o.value = z; o.textContent = z.replace(/_/g, ' '); return o; }));
  if (!zones.includes('UTC')) tz.prepend(new Option('UTC', 'UTC'));

  form.addEventListener('change', (ev) => {
    const f = form.elements;
    const name = ev.target.name;
    try {
      if (['lat_deg', 'lon_deg', 'elev_m', 'name', 'tz', 'event_start', 'event_end'].includes(name)) {
        const site = { ...app.state.site };
        if (name === 'name') site.name = f.name.value.slice(0, 80);
        else if (name === 'tz') site.tz = isValidZone(f.tz.value) ? f.tz.value : 'UTC';
        else if (name === 'event_start' || name === 'event_end') site[name] = f[name].value;
        else {
          const v = Number(f[name].value);
          const [lo, hi, label] = { lat_deg: [-90, 90, 'Latitude'], lon_deg: [-180, 180, 'Longitude'], elev_m: [-500, 9000, 'Elevation'] }[name];
          if (f[name].value === '' || !Number.isFinite(v) || v < lo || v > hi) throw new Error(`${label} must be a number from ${lo} to ${hi}.`);
          site[name] = v;
        }
        // Changing the zone keeps the wall-clock time the volunteer typed.
        app.updateSite(site, name === 'tz' ? zonedToUtcMs(f.date.value, f.time.value, site.tz) : undefined);
      } else if (name === 'date' || name === 'time') {
        app.updateTime(zonedToUtcMs(f.date.value, f.time.value, app.state.site.tz));
      }
    } catch (e) {
      app.showError(e.message);
    }
  });
  form.addEventListener('submit', (ev) => ev.preventDefault());
  $('now').addEventListener('click', () => app.updateTime(Date.now()));
  $('locate').addEventListener('click', () => {
    if (!navigator.geolocation) { app.showError('This browser cannot tell the device\'s location; type the latitude and longitude.'); return; }
    $('time-note').textContent = 'Asking the device for its location…';
    navigator.geolocation.getCurrentPosition((pos) => {
      const c = pos.coords;
      app.updateSite({ ...app.state.site, name: app.state.site.name || 'My location', lat_deg: +c.latitude.toFixed(5), lon_deg: +c.longitude.toFixed(5),
        elev_m: c.altitude != null ? Math.round(c.altitude) : app.state.site.elev_m, tz: deviceZone() });
      $('time-note').textContent = 'Location set from this device; the time zone was set to this device\'s zone. Check it if the site is elsewhere.';
    }, (err) => app.showError(`The device's location was not given (${err.message}). Type the latitude and longitude instead.`),
    { enableHighAccuracy: false, timeout: 20000, maximumAge: 600000 });
  });
}

export function renderSite(app) {
  const f = $('site-form').elements;
  const s = app.state.site;
  if (document.activeElement?.form !== $('site-form')) {
    f.name.value = s.name; f.lat_deg.value = s.lat_deg; f.lon_deg.value = s.lon_deg; f.elev_m.value = s.elev_m;
    f.event_start.value = s.event_start || ''; f.event_end.value = s.event_end || '';
  }
  f.tz.value = s.tz;
  const wall = utcToZoned(app.state.utc_ms, s.tz);
  f.date.value = wall.date; f.time.value = wall.time;
  $('time-note').textContent = `Site clock: ${siteLabel(app.state.utc_ms, s.tz)}.`;

  // Event hours: quick picks from start to end; hours after midnight fall on the next day.
  const hours = eventHours(s.event_start, s.event_end);
  const startH = parseInt(s.event_start, 10);
  const box = $('hours');
  box.replaceChildren(...hours.map((h) => {
    const b = document.createElement('button');
    b.type = 'button'; b.className = 'btn small'; b.textContent = h;
    b.setAttribute('aria-pressed', String(wall.time === h));
    b.addEventListener('click', () => {
      const now = utcToZoned(app.state.utc_ms, s.tz);
      const curH = parseInt(now.time, 10);
      const evening = new Date(`${now.date}T12:00:00Z`);
      if (curH < startH && hours.includes(`${String(curH).padStart(2, '0')}:00`)) evening.setUTCDate(evening.getUTCDate() - 1);
      const day = new Date(evening);
      if (parseInt(h, 10) < startH) day.setUTCDate(day.getUTCDate() + 1);
      app.updateTime(zonedToUtcMs(day.toISOString().slice(0, 10), h, s.tz));
    });
    return b;
  }));
}
