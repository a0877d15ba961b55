-- TDC records kept their piston-stop readings as typed: plain numbers, negative = BTDC on a signed
-- scale or 0 to 360 growing with the crank's turn, the scale inferred when not given (a negative
-- reading: signed; one past 180: 0 to 360; else signed). Each reading is rewritten as a number and
-- its side, the scale named, the meaning unchanged: −10 signed and 350 on 0–360 are "10 BTDC".
-- tdc_deg becomes degrees ATDC of the scale's 0, BTDC negative, on every scale (it was 0 to 360
-- on a 0–360 scale). Rows already written with sides are left alone.
WITH old AS (
	SELECT id, params, tdc_deg::numeric AS tdc, (params->>'a')::numeric AS a, (params->>'b')::numeric AS b
	FROM tdc_record
	WHERE params->>'a' ~ '^\s*[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?\s*$'
		AND params->>'b' ~ '^\s*[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?\s*$'
		AND tdc_deg ~ '^\s*[+-]?(\d+\.?\d*|\.\d+)\s*$'
), turned AS (
	SELECT id, params,
		CASE WHEN params->>'scale' IN ('signed', 'full') THEN params->>'scale'
			WHEN a < 0 OR b < 0 THEN 'signed' WHEN a > 180 OR b > 180 THEN 'full' ELSE 'signed' END AS scale,
		-- each angle into (−180, 180]: degrees ATDC, BTDC negative
		(SELECT CASE WHEN m > 180 THEN m - 360 ELSE m END FROM (SELECT mod(mod(a, 360) + 360, 360) AS m) x) AS sa,
		(SELECT CASE WHEN m > 180 THEN m - 360 ELSE m END FROM (SELECT mod(mod(b, 360) + 360, 360) AS m) x) AS sb,
		(SELECT CASE WHEN m > 180 THEN m - 360 ELSE m END FROM (SELECT mod(mod(tdc, 360) + 360, 360) AS m) x) AS st
	FROM old
)
UPDATE tdc_record r
SET params = turned.params || jsonb_build_object(
		'a', CASE WHEN sa = 0 THEN '0' WHEN sa < 0 THEN trim_scale(-sa)::text || ' BTDC' ELSE trim_scale(sa)::text || ' ATDC' END,
		'b', CASE WHEN sb = 0 THEN '0' WHEN sb < 0 THEN trim_scale(-sb)::text || ' BTDC' ELSE trim_scale(sb)::text || ' ATDC' END,
		'scale', turned.scale),
	tdc_deg = trim_scale(st)::text
FROM turned
WHERE r.id = turned.id;
