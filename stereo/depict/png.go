package depict

import (
	"image"
	"image/color"
	"image/draw"
	"image/png"
	"io"
	"math"
	"sync"

	"golang.org/x/image/font"
	"golang.org/x/image/font/gofont/gobold"
	"golang.org/x/image/font/gofont/gobolditalic"
	"golang.org/x/image/font/gofont/goregular"
	"golang.org/x/image/font/opentype"
	"golang.org/x/image/math/fixed"
	"golang.org/x/image/vector"
)

// This file implements the PNG writer: the scene the SVG writer paints,
// rasterised with golang.org/x/image/vector (anti-aliased polygon
// filling) and its text set in the Go fonts with golang.org/x/image's
// OpenType reader, in the light palette at twice the SVG's pixel size.
// golang.org/x/image is kept by the Go team beside the standard library;
// it brings an anti-aliased rasteriser, an OpenType reader and fonts
// whose licence lets them ship inside the binary, none of which the
// standard library has, so the PNG is painted from our own drawing model
// with no SVG renderer and no system fonts.

const pngScale = 2.0

var lightRGBA = [...]color.NRGBA{
	colFg:         {0x1c, 0x1d, 0x21, 0xff},
	colBg:         {0xfb, 0xfb, 0xf8, 0xff},
	colDesc:       {0x0b, 0x72, 0x85, 0xff},
	colErr:        {0xc2, 0x2a, 0x2a, 0xff},
	colWarn:       {0x9a, 0x62, 0x00, 0xff},
	colMuted:      {0x6a, 0x6d, 0x73, 0xff},
	colErrFill:    {214, 48, 48, 56},
	colWarnFill:   {230, 160, 20, 72},
	colChangeFill: {40, 110, 230, 66},
}

var fonts struct {
	once                    sync.Once
	regular, bold, boldItal *opentype.Font
	err                     error
	faces                   map[faceKey]font.Face
	mu                      sync.Mutex
}

type faceKey struct {
	size       float64
	bold, ital bool
}

func loadFonts() error {
	fonts.once.Do(func() {
		if fonts.regular, fonts.err = opentype.Parse(goregular.TTF); fonts.err != nil {
			return
		}
		if fonts.bold, fonts.err = opentype.Parse(gobold.TTF); fonts.err != nil {
			return
		}
		fonts.boldItal, fonts.err = opentype.Parse(gobolditalic.TTF)
		fonts.faces = map[faceKey]font.Face{}
	})
	return fonts.err
}

func face(size float64, bold, ital bool) (font.Face, error) {
	fonts.mu.Lock()
	defer fonts.mu.Unlock()
	k := faceKey{size, bold, ital}
	if f, ok := fonts.faces[k]; ok {
		return f, nil
	}
	src := fonts.regular
	switch {
	case bold && ital:
		src = fonts.boldItal
	case bold:
		src = fonts.bold
	}
	f, err := opentype.NewFace(src, &opentype.FaceOptions{Size: size, DPI: 72, Hinting: font.HintingNone})
	if err != nil {
		return nil, err
	}
	fonts.faces[k] = f
	return f, nil
}

// WritePNG writes the drawing as a PNG image.
func WritePNG(w io.Writer, d *Drawing) error {
	img, err := Rasterize(d)
	if err != nil {
		return err
	}
	return png.Encode(w, img)
}

// Rasterize paints the drawing into an image.
func Rasterize(d *Drawing) (*image.RGBA, error) {
	if err := loadFonts(); err != nil {
		return nil, err
	}
	sc := buildScene(d)
	W, H := int(math.Ceil(sc.w*pngScale)), int(math.Ceil(sc.h*pngScale))
	img := image.NewRGBA(image.Rect(0, 0, W, H))
	draw.Draw(img, img.Bounds(), &image.Uniform{lightRGBA[colBg]}, image.Point{}, draw.Src)
	r := vector.NewRasterizer(W, H)
	fill := func(col colour, pts []Point) {
		if len(pts) < 3 {
			return
		}
		r.Reset(W, H)
		r.MoveTo(float32(pts[0].X*pngScale), float32(pts[0].Y*pngScale))
		for _, p := range pts[1:] {
			r.LineTo(float32(p.X*pngScale), float32(p.Y*pngScale))
		}
		r.ClosePath()
		r.Draw(img, img.Bounds(), &image.Uniform{lightRGBA[col]}, image.Point{})
	}
	stroke := func(col colour, pts []Point, width float64) {
		for i := 0; i+1 < len(pts); i++ {
			fill(col, segment(pts[i], pts[i+1], width/2))
		}
	}
	for _, p := range sc.prims {
		switch p.kind {
		case pLine:
			stroke(p.col, p.pts, p.w)
		case pPath:
			stroke(p.col, p.pts, p.w)
		case pPoly:
			fill(p.col, p.pts)
		case pCircle:
			var pts []Point
			for k := 0; k < 32; k++ {
				pts = append(pts, p.pts[0].add(polar(p.r, 2*math.Pi*float64(k)/32)))
			}
			fill(p.col, pts)
		case pText:
			if err := drawText(img, &p); err != nil {
				return nil, err
			}
		}
	}
	return img, nil
}

// segment is a stroke of half-width h from p to q with round-ish ends,
// as a polygon.
func segment(p, q Point, h float64) []Point {
	u := q.sub(p).unit()
	n := u.perp().scale(h)
	e := u.scale(h * 0.5)
	return []Point{p.sub(e).add(n), q.add(e).add(n), q.add(e).sub(n), p.sub(e).sub(n)}
}

// drawText sets a text primitive's runs with the Go fonts.
func drawText(img *image.RGBA, p *prim) error {
	type piece struct {
		f  font.Face
		s  string
		dy float64
		w  fixed.Int26_6
	}
	var pieces []piece
	var total fixed.Int26_6
	for _, r := range p.runs {
		size, dy := p.size, 0.0
		switch r.shift {
		case -1:
			size, dy = p.size*0.72, p.size*0.3
		case 1:
			size, dy = p.size*0.72, -p.size*0.4
		}
		f, err := face(size*pngScale, p.bold, p.italic)
		if err != nil {
			return err
		}
		w := font.MeasureString(f, r.s)
		pieces = append(pieces, piece{f, r.s, dy, w})
		total += w
	}
	x := p.pts[0].X * pngScale
	switch p.anchor {
	case 0:
		x -= float64(total) / 64 / 2
	case 1:
		x -= float64(total) / 64
	}
	dot := fixed.Point26_6{X: fixed.Int26_6(x * 64)}
	for _, pc := range pieces {
		dot.Y = fixed.Int26_6((p.pts[0].Y + pc.dy) * pngScale * 64)
		dr := font.Drawer{Dst: img, Src: &image.Uniform{lightRGBA[p.col]}, Face: pc.f, Dot: dot}
		dr.DrawString(pc.s)
		dot.X = dr.Dot.X
	}
	return nil
}
