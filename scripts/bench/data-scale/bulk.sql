-- Set-based bulk seed for the data-scale benchmark. scripts/bench/data-scale/seed.ts runs it statement by
-- statement in one transaction, after the demo scenario and after storing the engine's analysis of a demo
-- capture in scale_template (report, preview, spectrum, figures, analysis_version). All in Harrowgate's lab.
create temporary table lab as select id from organisations where slug = 'harrowgate-lab';
create temporary table mgr as select id, name from users where email = 'maren.ilsley@harrowgate.example';

-- A third client, linked to the lab, with one portal user (same demo password hash as the others).
insert into organisations (name, slug, kind, address, contact_email, reference_code)
values ('Thornbeck Power Systems', 'thornbeck', 'manufacturer', '3 Weir Lane, Thornbeck TB1 4AA', 'qa@thornbeck.example', 'TPS-9');
insert into lab_clients (lab_id, client_id) select (select id from lab), id from organisations where slug = 'thornbeck';
insert into users (email, name, role, organisation_id, password_hash)
select 'ada.quill@thornbeck.example', 'Ada Quill', 'manufacturer', o.id, (select password_hash from users where email = 'ruan.petit@kestrum.example')
from organisations o where o.slug = 'thornbeck';

-- 16 more ratings (20 in the lab), each a copy of a demo rating for one of the three clients.
create temporary table tpl as
  select r.*, row_number() over (order by r.model_code) - 1 as k from ratings r where r.lab_id = (select id from lab);
create temporary table clients as
  select id, row_number() over (order by slug) - 1 as k from organisations where slug in ('kestrum', 'poldane', 'thornbeck');
insert into ratings (organisation_id, lab_id, model_code, title, nameplate)
select c.id, t.lab_id, t.model_code || '-S' || lpad(i::text, 2, '0'), t.title || ' (series ' || i || ')', t.nameplate
from generate_series(1, 16) i
join tpl t on t.k = i % 4
join clients c on c.k = i % 3;
insert into tolerance_profiles (rating_id, version, profile, reason, created_by_id)
select r.id, 1, p.profile, 'Started from a preset', (select id from mgr)
from ratings r join tpl t on r.model_code like t.model_code || '-S%' and r.lab_id = t.lab_id
join tolerance_profiles p on p.rating_id = t.id and p.version = 1;
insert into plan_steps (rating_id, position, name, test_kind, speed_min_rpm, speed_max_rpm, required_roles, checks)
select r.id, s.position, s.name, s.test_kind, s.speed_min_rpm, s.speed_max_rpm, s.required_roles, s.checks
from ratings r join tpl t on r.model_code like t.model_code || '-S%' and r.lab_id = t.lab_id
join plan_steps s on s.rating_id = t.id;

create temporary table lab_ratings as
  select r.id, r.organisation_id, row_number() over (order by r.model_code) - 1 as k,
         (select s.id from plan_steps s where s.rating_id = r.id order by s.position limit 1) as step_id,
         (select s.test_kind from plan_steps s where s.rating_id = r.id order by s.position limit 1) as test_kind,
         (select (s.speed_min_rpm + s.speed_max_rpm) / 2 from plan_steps s where s.rating_id = r.id order by s.position limit 1) as speed
  from ratings r where r.lab_id = (select id from lab);
create temporary table benches as select id, row_number() over (order by name) - 1 as bk from stations where lab_id = (select id from lab);

-- 10 000 units: 1 in 10 open and failing (the review queue), the rest mostly accepted.
insert into units (serial, rating_id, organisation_id, lab_id, disposition, plan_state, created_by_id, created_at)
select 'SC' || lpad(i::text, 6, '0'), r.id, r.organisation_id, (select id from lab),
       (case when i % 10 = 0 then 'open' when i % 10 = 1 then 'open' when i % 50 = 7 then 'rework' else 'accepted' end)::disposition,
       (case when i % 10 = 0 then 'failed' when i % 10 = 1 then 'incomplete' else 'complete-within' end)::plan_state,
       (select id from mgr), now() - interval '730 days' + (i * interval '1 hour' * 1.7)
from generate_series(1, {{UNITS}}) i join lab_ratings r on r.k = i % 20;

-- 100 captures per unit, spread over the two years before now.
create temporary table su as
  select u.id, u.rating_id, row_number() over (order by u.serial) as n, u.created_at from units u where u.serial like 'SC%';
insert into captures (unit_id, lab_id, station_id, uploaded_by_id, test_kind, speed_rpm, plan_step_id, channel_roles, original_name, object_key,
                      size_bytes, sha256, state, state_message, progress, attempts, uploaded_at, analysed_at, created_at, updated_at)
select su.id, (select id from lab), b.id, (select id from mgr), coalesce(r.test_kind, 'no-load'), r.speed, r.step_id,
       '{"V_AB (V)": "vab", "V_BC (V)": "vbc", "V_CA (V)": "vca"}'::jsonb,
       'SC' || lpad(su.n::text, 6, '0') || '-' || ck || '.csv', 'scale/' || su.id || '/' || ck || '.csv',
       300000 + (ck * 37 % 5000), md5(su.id::text || ck) || md5(ck::text || su.id::text),
       (case when ck = 50 then 'failed' when ck = 60 and su.n % 5 = 0 then 'rejected' else 'analysed' end)::capture_state,
       case when ck = 50 then 'The analysis failed after 5 attempts' when ck = 60 and su.n % 5 = 0 then 'The file has no numeric columns' end,
       100, 1, t, t + interval '20 seconds', t, t + interval '20 seconds'
from su cross join generate_series(1, {{PER_UNIT}}) as g(ck)
join lab_ratings r on r.id = su.rating_id
join benches b on b.bk = ck % 2
cross join lateral (select su.created_at + (ck * interval '1 hour' * 1.6) as t) tt;

-- One current analysis per analysed capture: the engine's report for a demo capture, varied in a few figures.
insert into analyses (capture_id, analysis_version, tolerance_digest, profile_version_id, plan_step_id, kind, current, report, overall,
                      frequency_hz, worst_thd_percent, vuf_percent, ke_line_rms_per_krpm, preview, spectrum, created_at)
select c.id, (select analysis_version from scale_template), 'scale', p.id, c.plan_step_id, 'analysis', true,
       jsonb_set(jsonb_set(jsonb_set((select report from scale_template), '{frequencyHz}', to_jsonb(v.freq)), '{overall}', to_jsonb(v.overall)),
                 '{channels,0,thdFPercent}', to_jsonb(v.thd)),
       v.overall::verdict_status, v.freq, v.thd, 0.1 + h.u * 0.5, null,
       null, (select spectrum from scale_template), c.created_at + interval '20 seconds'
from captures c
join units u on u.id = c.unit_id
join tolerance_profiles p on p.rating_id = u.rating_id and p.version = 1
cross join lateral (select (hashtext(c.id::text) & 65535) / 65535.0 as u) h
cross join lateral (select 50 + (h.u - 0.5) * 0.2 as freq, round((0.6 + h.u * 5)::numeric, 4)::float8 as thd,
                           case when h.u > 0.93 then 'fail' when h.u > 0.85 then 'marginal' else 'pass' end as overall) v
where c.state = 'analysed' and u.serial like 'SC%';

-- The waveform preview (115 KB) on the latest capture of each unit only: 1e6 copies would be ~115 GB.
update analyses a set preview = (select preview from scale_template)
from (select distinct on (c.unit_id) c.id from captures c join units u on u.id = c.unit_id
      where u.serial like 'SC%' and c.state = 'analysed' order by c.unit_id, c.created_at desc) latest
where a.capture_id = latest.id;

-- Figure rows for the trends: every check figure and the single harmonics up to the 7th.
create temporary table tf as
  select * from json_to_recordset((select figures::json from scale_template))
    as x(figure text, "harmonicOrder" int, value float8, status text, flagged boolean, "expandedUncertainty" float8)
  where figure <> 'harmonic' or "harmonicOrder" <= 7;
insert into analysis_figures (analysis_id, capture_id, unit_id, rating_id, lab_id, figure, harmonic_order, value, expanded_uncertainty,
                              status, flagged, current, measured_at, plan_step_id)
select a.id, a.capture_id, c.unit_id, u.rating_id, c.lab_id, tf.figure, tf."harmonicOrder",
       tf.value * (0.97 + ((hashtext(a.id::text || tf.figure) & 1023) / 1023.0) * 0.06), tf."expandedUncertainty",
       tf.status::verdict_status, tf.flagged, true, c.created_at, a.plan_step_id
from analyses a join captures c on c.id = a.capture_id join units u on u.id = c.unit_id cross join tf
where u.serial like 'SC%';

-- The units' latest result, as the worker keeps it.
update units u set latest_capture_at = l.created_at, latest_overall = l.overall
from (select distinct on (c.unit_id) c.unit_id, c.created_at, a.overall from captures c join analyses a on a.capture_id = c.id and a.current
      order by c.unit_id, c.created_at desc) l
where l.unit_id = u.id and u.serial like 'SC%';
update units set latest_overall = 'fail' where serial like 'SC%' and plan_state = 'failed';

-- Dispositions of the decided units, and a released report (revision 1) for each accepted one.
insert into unit_events (unit_id, actor_id, kind, from_disposition, to_disposition, comment, created_at)
select u.id, (select id from mgr), 'disposition', 'open', u.disposition, 'Reviewed against the plan', u.latest_capture_at + interval '1 day'
from units u where u.serial like 'SC%' and u.disposition <> 'open';
insert into signatures (lab_id, signer_id, signer_name, signer_role, purpose, meaning, subject_kind, subject_id, signed_at)
select u.lab_id, m.id, m.name, 'admin', 'release', 'reviewed and approved for release', 'unit', u.id, u.latest_capture_at + interval '2 days'
from units u cross join mgr m where u.serial like 'SC%' and u.disposition = 'accepted';
insert into reports (lab_id, unit_id, client_id, number, revision, status, object_key, sha256, size_bytes, page_count, disposition, overall,
                     content, released_at, released_by_id, signature_id)
select u.lab_id, u.id, u.organisation_id, 'R-S' || substr(u.serial, 3), 1, 'valid', 'reports/scale/' || u.id || '.pdf',
       md5(u.id::text) || md5(u.serial), 48000, 3, u.disposition, u.latest_overall,
       jsonb_build_object('serial', u.serial, 'steps', jsonb_build_array(jsonb_build_object('name', 'Open circuit at rated speed', 'overall', u.latest_overall))),
       s.signed_at, s.signer_id, s.id
from units u join signatures s on s.subject_kind = 'unit' and s.subject_id = u.id and s.purpose = 'release'
where u.serial like 'SC%' and u.disposition = 'accepted';
update lab_settings set next_report_number = 100000 where lab_id = (select id from lab);

create table scale_seed_marker (seeded_at timestamptz not null default now(), captures bigint not null);
insert into scale_seed_marker (captures) select count(*) from captures;
