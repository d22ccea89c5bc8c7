package calcdoc

import "bytes"

// MaxNesting is the deepest nesting of block quotes and lists a calc file
// may open on one line, and of square brackets anywhere. Markdown's cost
// grows with the square of these depths; real calcs nest a few levels.
const MaxNesting = 32

// MaxBrackets is the most opening square brackets one paragraph (lines
// up to a blank line) may hold: the parser's cost for link texts grows
// faster than the count.
const MaxBrackets = 1024

// checkNesting scans src once, before the Markdown parser sees it, and
// returns the offset and a message for the first line that nests block
// quotes and lists, or square brackets, deeper than MaxNesting, or that
// brings a paragraph over MaxBrackets opening brackets; ok is false then.
// Square brackets are counted across the lines of a paragraph (a blank
// line ends one), as the parser reads them.
func checkNesting(src []byte) (off int, msg string, ok bool) {
	brackets, opened := 0, 0
	for start := 0; start < len(src); {
		end := bytes.IndexByte(src[start:], '\n')
		if end < 0 {
			end = len(src)
		} else {
			end += start
		}
		line := src[start:end]
		if depth := containerDepth(line); depth > MaxNesting {
			return start, sprintf("this line nests %d block quotes and lists; at most %d are read", depth, MaxNesting), false
		}
		if len(bytes.TrimSpace(line)) == 0 {
			brackets, opened = 0, 0
		}
		for i, c := range line {
			switch c {
			case '[':
				if brackets++; brackets > MaxNesting {
					return start + i, sprintf("square brackets nest more than %d deep here; at most %d levels are read", MaxNesting, MaxNesting), false
				}
				if opened++; opened > MaxBrackets {
					return start + i, sprintf("this paragraph holds more than %d square brackets [; put a blank line between paragraphs", MaxBrackets), false
				}
			case ']':
				brackets = max(brackets-1, 0)
			}
		}
		start = end + 1
	}
	return 0, "", true
}

// containerDepth counts the block-quote markers (>) and list markers (-,
// *, + or a number with . or ), then a space) that open a line.
func containerDepth(line []byte) int {
	depth := 0
	for i := 0; i < len(line); {
		switch c := line[i]; {
		case c == ' ' || c == '\t':
			i++
		case c == '>':
			depth++
			i++
		case (c == '-' || c == '*' || c == '+') && i+1 < len(line) && (line[i+1] == ' ' || line[i+1] == '\t'):
			depth++
			i += 2
		case c >= '0' && c <= '9':
			j := i
			for j < len(line) && j-i < 9 && line[j] >= '0' && line[j] <= '9' {
				j++
			}
			if j+1 < len(line) && (line[j] == '.' || line[j] == ')') && (line[j+1] == ' ' || line[j+1] == '\t') {
				depth++
				i = j + 2
				continue
			}
			return depth
		default:
			return depth
		}
	}
	return depth
}
