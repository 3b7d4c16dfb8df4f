package depict

import "math"

// This file implements the plane geometry the layout uses.

func (p Point) add(q Point) Point     { return Point{p.X + q.X, p.Y + q.Y} }
func (p Point) sub(q Point) Point     { return Point{p.X - q.X, p.Y - q.Y} }
func (p Point) scale(f float64) Point { return Point{p.X * f, p.Y * f} }
func (p Point) dot(q Point) float64   { return p.X*q.X + p.Y*q.Y }
func (p Point) cross(q Point) float64 { return p.X*q.Y - p.Y*q.X }
func (p Point) norm() float64         { return math.Hypot(p.X, p.Y) }
func (p Point) dist(q Point) float64  { return math.Hypot(p.X-q.X, p.Y-q.Y) }
func (p Point) angle() float64        { return math.Atan2(p.Y, p.X) }
func (p Point) perp() Point           { return Point{-p.Y, p.X} }
func polar(r, theta float64) Point    { return Point{r * math.Cos(theta), r * math.Sin(theta)} }
func (p Point) rotate(t float64) Point {
	s, c := math.Sincos(t)
	return Point{p.X*c - p.Y*s, p.X*s + p.Y*c}
}
func (p Point) around(c Point, t float64) Point { return p.sub(c).rotate(t).add(c) }

func (p Point) unit() Point {
	n := p.norm()
	if n < 1e-12 {
		return Point{1, 0}
	}
	return p.scale(1 / n)
}

// reflect returns p mirrored across the line through a and b.
func (p Point) reflect(a, b Point) Point {
	d := b.sub(a).unit()
	v := p.sub(a)
	along := d.scale(v.dot(d))
	return a.add(along.scale(2).sub(v))
}

// side is +1 when p lies left of the directed line a→b, -1 right, 0 on it.
func side(p, a, b Point) int {
	c := b.sub(a).cross(p.sub(a))
	switch {
	case c > 1e-6:
		return 1
	case c < -1e-6:
		return -1
	}
	return 0
}

// normAngle maps t into [0, 2π).
func normAngle(t float64) float64 {
	t = math.Mod(t, 2*math.Pi)
	if t < 0 {
		t += 2 * math.Pi
	}
	return t
}

// angleDiff is the absolute difference of two directions, in [0, π].
func angleDiff(a, b float64) float64 {
	d := math.Abs(normAngle(a - b))
	if d > math.Pi {
		d = 2*math.Pi - d
	}
	return d
}

// segmentsCross reports whether segments pq and rs cross at a point
// inside both (touching ends do not count).
func segmentsCross(p, q, r, s Point) bool {
	d1 := q.sub(p).cross(r.sub(p))
	d2 := q.sub(p).cross(s.sub(p))
	d3 := s.sub(r).cross(p.sub(r))
	d4 := s.sub(r).cross(q.sub(r))
	const eps = 1e-9
	return ((d1 > eps && d2 < -eps) || (d1 < -eps && d2 > eps)) &&
		((d3 > eps && d4 < -eps) || (d3 < -eps && d4 > eps))
}

// largestGap returns the start direction and width of the widest angular
// gap between the given directions (a full turn when there are none).
func largestGap(dirs []float64) (start, width float64) {
	if len(dirs) == 0 {
		return 0, 2 * math.Pi
	}
	s := make([]float64, len(dirs))
	for i, d := range dirs {
		s[i] = normAngle(d)
	}
	sortFloats(s)
	width = -1
	for i := range s {
		next := s[0] + 2*math.Pi
		if i+1 < len(s) {
			next = s[i+1]
		}
		if g := next - s[i]; g > width+1e-9 {
			start, width = s[i], g
		}
	}
	return start, width
}

func sortFloats(s []float64) {
	for i := 1; i < len(s); i++ {
		for j := i; j > 0 && s[j] < s[j-1]; j-- {
			s[j], s[j-1] = s[j-1], s[j]
		}
	}
}

// orient is the signed volume of the tetrahedron p0..p3.
func orient(p [4][3]float64) float64 {
	var a, b, c [3]float64
	for k := 0; k < 3; k++ {
		a[k] = p[1][k] - p[0][k]
		b[k] = p[2][k] - p[0][k]
		c[k] = p[3][k] - p[0][k]
	}
	return a[0]*(b[1]*c[2]-b[2]*c[1]) - a[1]*(b[0]*c[2]-b[2]*c[0]) + a[2]*(b[0]*c[1]-b[1]*c[0])
}

// segmentDist is the distance from p to the segment ab.
func segmentDist(p, a, b Point) float64 {
	ab := b.sub(a)
	t := 0.0
	if n := ab.dot(ab); n > 1e-12 {
		t = min(1, max(0, p.sub(a).dot(ab)/n))
	}
	return p.dist(a.add(ab.scale(t)))
}
