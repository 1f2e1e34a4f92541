import { describe, expect, it } from 'vitest';
import { parseExposition, parseNumber } from '../../collectors/exposition/text-format';

// The example of the Prometheus "Exposition formats" page (text format section), recalled from memory.
const PROMETHEUS_EXAMPLE = `# HELP http_requests_total The total number of HTTP requests.
# TYPE http_requests_total counter
http_requests_total{method="post",code="200"} 1027 1395066363000
http_requests_total{method="post",code="400"}    3 1395066363000

# Escaping in label values:
msdos_file_access_time_seconds{path="C:\\\\DIR\\\\FILE.TXT",error="Cannot find file:\\n\\"FILE.TXT\\""} 1.458255915e9

# Minimalistic line:
metric_without_timestamp_and_labels 12.47

# A weird metric from before the epoch:
something_weird{problem="division by zero"} +Inf -3982045

# A histogram, which has a pretty complex representation in the text format:
# HELP http_request_duration_seconds A histogram of the request duration.
# TYPE http_request_duration_seconds histogram
http_request_duration_seconds_bucket{le="0.05"} 24054
http_request_duration_seconds_bucket{le="+Inf"} 144320
http_request_duration_seconds_sum 53423
http_request_duration_seconds_count 144320
`;

// In the style of the OpenMetrics 1.0 specification's examples (recalled from memory): UNIT, _created, an exemplar, # EOF.
const OPENMETRICS_EXAMPLE = `# TYPE acme_http_router_request_seconds summary
# UNIT acme_http_router_request_seconds seconds
# HELP acme_http_router_request_seconds Latency though all of ACME's HTTP request router.
acme_http_router_request_seconds_sum{path="/api/v1",method="GET"} 9036.32
acme_http_router_request_seconds_count{path="/api/v1",method="GET"} 807283.0
acme_http_router_request_seconds_created{path="/api/v1",method="GET"} 1605281325.0
# TYPE foo histogram
foo_bucket{le="0.01"} 0 # {trace_id="KOO5S4vxi0o"} 0.67
foo_bucket{le="+Inf"} 17 1520879607.789
# EOF
`;

describe('parseExposition', () => {
  it('when given the text format example, then every sample, label escape, timestamp and +Inf is read', () => {
    const parsed = parseExposition(PROMETHEUS_EXAMPLE, 'prometheus');
    if (!parsed.ok) throw new Error(parsed.reason);
    expect(parsed.samples).toHaveLength(9);
    expect(parsed.samples[0]).toMatchObject({ name: 'http_requests_total', labels: { method: 'post', code: '200' }, value: 1027, timestamp: 1395066363000, line: 3 });
    expect(parsed.samples[1].value).toBe(3);
    expect(parsed.samples[2].labels).toEqual({ path: 'C:\\DIR\\FILE.TXT', error: 'Cannot find file:\n"FILE.TXT"' });
    expect(parsed.samples[2].value).toBe(1.458255915e9);
    expect(parsed.samples[3]).toMatchObject({ name: 'metric_without_timestamp_and_labels', value: 12.47 });
    expect(parsed.samples[4]).toMatchObject({ value: Infinity, timestamp: -3982045 });
    expect(parsed.samples[7]).toMatchObject({ name: 'http_request_duration_seconds_sum', value: 53423 });
  });

  it('when given an OpenMetrics body with UNIT, an exemplar and # EOF, then the samples are read and the exemplar ignored', () => {
    const parsed = parseExposition(OPENMETRICS_EXAMPLE, 'openmetrics');
    if (!parsed.ok) throw new Error(parsed.reason);
    expect(parsed.samples.map((s) => s.name)).toEqual([
      'acme_http_router_request_seconds_sum',
      'acme_http_router_request_seconds_count',
      'acme_http_router_request_seconds_created',
      'foo_bucket',
      'foo_bucket',
    ]);
    expect(parsed.samples[3]).toMatchObject({ labels: { le: '0.01' }, value: 0 });
    expect(parsed.samples[3].timestamp).toBeUndefined();
    expect(parsed.samples[4].timestamp).toBe(1520879607.789);
  });

  it('when an OpenMetrics body lacks # EOF, then it is refused as cut short', () => {
    const parsed = parseExposition(OPENMETRICS_EXAMPLE.replace('# EOF\n', ''), 'openmetrics');
    expect(parsed).toEqual({ ok: false, reason: 'parse error: the OpenMetrics body does not end with # EOF (cut short?)' });
  });

  it('when text follows # EOF, then the line after it is named', () => {
    expect(parseExposition('a 1\n# EOF\nb 2\n', 'openmetrics')).toEqual({ ok: false, reason: 'parse error at line 3: text after # EOF' });
  });

  it.each([
    ['x{a="1', 'line 2: the value of label a is not closed with "'],
    ['x{a="1"', 'line 2: expected , or } after the value of label a'],
    ['x{a=1} 2', 'line 2: the value of label a must be in double quotes'],
    ['x{a="1",a="2"} 2', 'line 2: label a appears twice'],
    ['x{a="\\t"} 2', 'line 2: label a has an unknown escape \\t'],
    ['x{a="1" b="2"} 2', 'line 2: expected , or } after the value of label a'],
    ['x{1a="1"} 2', 'line 2: expected a label name or }'],
    ['x', 'line 2: x has no value'],
    ['x 0x10', 'line 2: x has a value that is not a number: "0x10"'],
    ['x 1 2 3', 'line 2: unexpected text after the timestamp of x'],
    ['x 1 soon', 'line 2: x has a timestamp that is not a number'],
    ['9x 1', 'line 2: a sample must start with a metric name'],
    ['x{a="1"}2', 'line 2: expected a space after x'],
    ['# TYPE', 'line 2: # TYPE needs a metric name'],
    ['# HELP bad-name text', 'line 2: # HELP needs a metric name (got "bad-name")'],
  ])('when line 2 is %j, then the reason says %j', (line, reason) => {
    const parsed = parseExposition(`ok_metric 1\n${line}\n`, 'prometheus');
    expect(parsed.ok).toBe(false);
    if (!parsed.ok) expect(parsed.reason).toContain(`parse error at ${reason}`);
  });

  it('when labels have spaces, a trailing comma and CRLF line ends, then they are still read', () => {
    const parsed = parseExposition('x{ a = "1" , b="2", } 5\r\n', 'prometheus');
    expect(parsed).toEqual({ ok: true, samples: [{ name: 'x', labels: { a: '1', b: '2' }, value: 5, line: 1 }] });
  });

  it('when a label is named __proto__, then it is kept as an ordinary label', () => {
    const parsed = parseExposition('x{__proto__="p"} 1\n', 'prometheus');
    if (!parsed.ok) throw new Error(parsed.reason);
    expect(parsed.samples[0].labels.__proto__).toBe('p');
  });
});

describe('parseNumber', () => {
  // Spellings a Go ParseFloat (which the format's reference parser uses) accepts, recalled from memory.
  it.each([
    ['NaN', NaN], ['Nan', NaN], ['+Inf', Infinity], ['-Inf', -Infinity], ['Inf', Infinity], ['1e3', 1000], ['-1.5E-2', -0.015], ['.5', 0.5], ['7.', 7],
  ])('when the token is %s, then the number is %s', (token, value) => {
    expect(parseNumber(token)).toBe(value);
  });

  it.each(['', ' ', '0x1F', '1_000', 'one', '1e', '--1', 'Infinit'])('when the token is %j, then it is not a number', (token) => {
    expect(parseNumber(token)).toBeUndefined();
  });
});
