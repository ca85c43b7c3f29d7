// Model stage: the feed chain between the transmitter and a feed: `transformer` (turns,
// magnetizing and leakage inductance, core loss, compensation) and `line` (a named cable, or
// its z0, velocity factor and loss). Both take `NAME at FEED` and then clauses in any order,
// each statement given as a table of the clauses it accepts (their kinds, units, ranges and
// rivals) read by one function. Inputs: the statement's tokens and the feeds above it;
// outputs: the Model's transformers and feed lines.
#include <fmt/format.h>

#include <algorithm>
#include <cctype>
#include <cmath>
#include <tuple>

#include "model/line_loss.hpp"
#include "model/parser.hpp"
#include "wirefield/network.hpp"

namespace wirefield::model {
namespace {

// Largest matched loss of a feed line at its loss figures: 1000 dB passes 1e-100 of the
// power, far past any real line, and stays far inside the 6158 dB (709 nepers) where e^x
// overflows double precision in the line's cosh and sinh.
constexpr double kMaxLineLossDb = 1000.0;

}  // namespace

// The feed a transformer or line sits at: a feed defined on an earlier line.
std::string Parser::ChainFeed(const std::string& context) {
  if (!IsWord("at")) throw Expected(context, "'at FEED'");
  Next();
  const Token& t = Peek();
  if (t.kind != TokenKind::kName) throw Expected(context, "a feed name after 'at'");
  Next();
  if (feed_lines_.count(t.text) == 0) {
    std::vector<std::string> names;
    for (const FeedSpec& f : model_.feeds) names.push_back(f.name);
    throw Error(t, fmt::format("{}: unknown feed '{}'{}{}", context, Shorten(t.text),
                               DidYouMeanAside(t.text, names),
                               names.empty() ? "; no feed is defined above this line"
                                             : "; a feed must be defined on an earlier line"));
  }
  return t.text;
}

// `NAME at FEED` after the statement's word: a name new among the statements of its kind, and
// a feed that has none of them yet (a feed takes one transformer and one line).
Parser::ChainHead Parser::ReadChainHead(
    const Token& keyword, const std::string& statement, const std::string& usage,
    const std::map<std::string, SourceLocation>& names,
    const std::map<std::string, std::pair<std::string, SourceLocation>>& at_feed) {
  ChainHead head;
  head.named = NewName(keyword, statement, statement, usage, names);
  const std::string& context = head.named.context;
  const Token feed_token = tokens_[pos_ + 1 < tokens_.size() ? pos_ + 1 : pos_];
  head.feed = ChainFeed(context);
  if (const auto it = at_feed.find(head.feed); it != at_feed.end()) {
    throw Error(feed_token, fmt::format("{}: feed '{}' already has {} '{}' ({}); a feed takes "
                                        "one {}",
                                        context, head.feed, statement, it->second.first,
                                        Line(it->second.second), statement));
  }
  return head;
}

// The clauses of a transformer or line, in any order to the end of the line, each read and
// checked by its row of the statement's table. Returns the word of each clause given.
std::map<std::string, Token> Parser::ReadChainClauses(const ChainStatement& statement) {
  std::vector<std::string> words;  // offered as spellings of an unknown clause
  for (const ChainClause& c : statement.clauses) {
    if (!c.hidden) words.push_back(c.word);
  }
  std::map<std::string, Token> given;
  while (Peek().kind != TokenKind::kEnd) {
    const Token word = Peek();
    const auto row = std::find_if(
        statement.clauses.begin(), statement.clauses.end(),
        [&](const ChainClause& c) { return word.kind == TokenKind::kName && c.word == word.text; });
    if (row == statement.clauses.end()) {
      throw Error(
          word,
          fmt::format("{}: unexpected {}{}; the clauses are {}", statement.context, Quote(word),
                      word.kind == TokenKind::kName ? DidYouMeanAside(word.text, words) : "",
                      statement.clause_list));
    }
    Next();
    std::optional<Measured> m;
    if (statement.value_first) m = ChainClauseValue(statement, *row, word);
    CheckChainClause(statement, *row, word, given);
    if (!statement.value_first) m = ChainClauseValue(statement, *row, word);
    ApplyChainClause(statement, *row, word, m);
    given.emplace(row->word, word);
  }
  return given;
}

// The '=' of a clause written word=VALUE, then its value, unless it reads its own tokens.
std::optional<Parser::Measured> Parser::ChainClauseValue(const ChainStatement& statement,
                                                         const ChainClause& clause,
                                                         const Token& word) {
  if (clause.equals) {
    ExpectPunct("=", statement.context, fmt::format("'=' after {}", word.text));
  }
  if (clause.check == ClauseCheck::kTokens) return std::nullopt;
  return Expression();
}

// A clause may be given once, and not beside a rival (a clause of its group on another side).
void Parser::CheckChainClause(const ChainStatement& statement, const ChainClause& clause,
                              const Token& word, const std::map<std::string, Token>& given) const {
  if (given.count(clause.word) != 0) {
    throw Error(word, fmt::format("{}: {} is given twice", statement.context, word.text));
  }
  if (clause.group == 0) return;
  for (const ChainClause& other : statement.clauses) {
    if (other.group == clause.group && other.side != clause.side && given.count(other.word) != 0) {
      throw Error(word, fmt::format("{}: {}", statement.context, clause.either));
    }
  }
}

// Checks the clause's value by the kind its row gives, and stores it.
void Parser::ApplyChainClause(const ChainStatement& statement, const ChainClause& clause,
                              const Token& word, const std::optional<Measured>& m) {
  const std::string& context = statement.context;
  const std::string what = fmt::format("{}: {}", context, clause.word);
  switch (clause.check) {
    case ClauseCheck::kPositive:
      clause.store(Positive(*m, *clause.quantity, clause.kind, context, clause.word, clause.note,
                            clause.bare_factor));
      return;
    case ClauseCheck::kNotNegative: {
      const double v = As(*m, *clause.quantity, clause.bare_factor, what);
      if (v < 0.0) {
        throw Error(m->start, fmt::format("{} must not be negative; got {} {}", what,
                                          FormatNumber(v), clause.quantity->si_unit));
      }
      InRange(clause.kind, v, *m, what);
      clause.store(v);
      return;
    }
    case ClauseCheck::kPlainPositive: {
      const double v = Plain(*m, what, clause.note);
      if (!(v > 0.0)) {
        throw Error(m->start, fmt::format("{} must be positive; got {}", what, FormatNumber(v)));
      }
      InRange(clause.kind, v, *m, what);
      clause.store(v);
      return;
    }
    case ClauseCheck::kValue:
      clause.read_value(word, *m);
      return;
    case ClauseCheck::kTokens:
      clause.read_tokens(word);
      return;
  }
}

// ---- transformer ----------------------------------------------------------------------------

void Parser::Transformer(const Token& keyword) {
  const ChainHead head = ReadChainHead(keyword, "transformer",
                                       "a transformer name (transformer NAME at FEED turns P:S)",
                                       transformer_lines_, feed_transformer_);
  TransformerSpec t = Started<TransformerSpec>(head.named);
  t.feed = head.feed;
  const std::string& context = head.named.context;
  const std::string magnetizing_either =
      "give either magnetizing=L or al=A_L (which sets L = A_L * P^2), not both";
  const std::string core_either = "give either coreloss=R or q=Q, not both";
  ChainStatement statement;
  statement.context = context;
  statement.clause_list =
      "turns P:S, magnetizing=L, al=A_L, leakage=L, compensation=C, coreloss=R and q=Q";
  statement.value_first = true;
  statement.clauses = {
      {.word = "turns",
       .equals = false,
       .check = ClauseCheck::kTokens,
       .read_tokens = [&](const Token&) { Turns(context, &t); }},
      {.word = "magnetizing",
       .quantity = &InductanceQuantity(),
       .kind = ValueKind::kInductanceH,
       .note = " (leave it out for an ideal transformer)",
       .group = 1,
       .side = 1,
       .either = magnetizing_either,
       .store = [&](double v) { t.magnetizing_inductance_h = v; }},
      {.word = "al",
       .check = ClauseCheck::kValue,
       .group = 1,
       .side = 2,
       .either = magnetizing_either,
       .read_value = [&](const Token&, const Measured& m) { CoreAl(context, m, &t); }},
      {.word = "leakage",
       .check = ClauseCheck::kNotNegative,
       .quantity = &InductanceQuantity(),
       .kind = ValueKind::kInductanceH,
       .store = [&](double v) { t.leakage_inductance_h = v; }},
      {.word = "compensation",
       .quantity = &CapacitanceQuantity(),
       .kind = ValueKind::kCapacitanceF,
       .note = " (leave it out for no capacitor)",
       .store = [&](double v) { t.compensation_capacitance_f = v; }},
      {.word = "coreloss",
       .quantity = &ResistanceQuantity(),
       .kind = ValueKind::kResistanceOhm,
       .note = " (leave it out for a lossless core)",
       .group = 2,
       .side = 1,
       .either = core_either,
       .store = [&](double v) { t.core_loss_resistance_ohm = v; }},
      {.word = "q",
       .check = ClauseCheck::kPlainPositive,
       .kind = ValueKind::kQuality,
       .note = "the Q of the magnetizing inductance",
       .group = 2,
       .side = 2,
       .either = core_either,
       .store = [&](double v) { t.core_q = v; }},
      // `ratio 1:49`: a transformer takes its turns; the error says which.
      {.word = "ratio",
       .equals = false,
       .check = ClauseCheck::kTokens,
       .hidden = true,
       .read_tokens = [&](const Token& word) { throw RatioError(context, word); }},
  };
  const std::map<std::string, Token> given = ReadChainClauses(statement);
  if (given.count("turns") == 0) {
    throw Expected(context, "'turns P:S' (transmitter side : antenna side, as in turns 2:16)");
  }
  if (given.count("q") != 0 && given.count("magnetizing") == 0 && given.count("al") == 0) {
    throw Error(given.at("q"), fmt::format("{}: q= is the Q of the magnetizing inductance; give "
                                           "magnetizing=L or al=A_L too",
                                           context));
  }
  transformer_lines_[t.name] = t.location;
  feed_transformer_[t.feed] = {t.name, t.location};
  model_.transformers.push_back(std::move(t));
}

// `turns P:S` after the word turns: the primary (transmitter side) and secondary turns.
void Parser::Turns(const std::string& context, TransformerSpec* t) {
  if (Peek().kind == TokenKind::kNumber && pos_ + 1 < tokens_.size() &&
      tokens_[pos_ + 1].kind == TokenKind::kNumber) {  // "turns 2 16"
    throw Error(tokens_[pos_ + 1],
                fmt::format("{}: expected ':' between the primary and the secondary turns "
                            "(turns 2:16); got {}",
                            context, Quote(tokens_[pos_ + 1])));
  }
  const Measured p = Expression();
  t->primary_turns = Plain(p, context + ": turns", "the primary turns, as in turns 2:16");
  if (!IsPunct(":")) {
    throw Expected(context, "':' between the primary and the secondary turns (turns 2:16)");
  }
  Next();
  const Measured s = Expression();
  t->secondary_turns = Plain(s, context + ": turns", "the secondary turns, as in turns 2:16");
  for (const auto& [value, at, side] :
       {std::tuple{t->primary_turns, p.start, "primary (transmitter side)"},
        std::tuple{t->secondary_turns, s.start, "secondary (antenna side)"}}) {
    if (!(value > 0.0)) {
      throw Error(at, fmt::format("{}: the {} turns must be positive; got {}", context, side,
                                  FormatNumber(value)));
    }
    if (auto message = OutOfRange(ValueKind::kTransformerTurns, value,
                                  fmt::format("{}: the {} turns", context, side))) {
      throw Error(at, *message);
    }
  }
}

// `al=A_L`: the core's inductance per turn squared, in nH/turn^2 (a plain number, or with nH).
void Parser::CoreAl(const std::string& context, const Measured& m, TransformerSpec* t) const {
  double al = 0.0;
  if (m.value.dimension == kInductance) {
    al = m.value.si / 1e-9;
  } else if (m.value.dimension.IsNone()) {
    al = m.value.si;
  } else {
    throw Error(m.start, fmt::format("{}: al needs A_L in nH/turn^2 (a plain number, or "
                                     "with nH); got {}",
                                     context, Describe(m.value.dimension)));
  }
  if (!(al > 0.0)) {
    throw Error(m.start, fmt::format("{}: al must be positive; got {} nH/turn^2", context,
                                     FormatNumber(al)));
  }
  InRange(ValueKind::kAlNanohenryPerTurn2, al, m, context + ": al");
  t->al_nh_per_turn2 = al;
}

// `ratio 1:49` after the word ratio: the transformer takes its turns, whose square is the impedance
// ratio; the error names the turns that give the ratio written.
InputError Parser::RatioError(const std::string& context, const Token& ratio) {
  if (IsPunct("=")) Next();
  const size_t p = pos_;
  const auto number = [&](size_t i) {
    return i < tokens_.size() && tokens_[i].kind == TokenKind::kNumber && tokens_[i].number > 0.0;
  };
  if (number(p) && p + 2 < tokens_.size() && tokens_[p + 1].kind == TokenKind::kPunct &&
      tokens_[p + 1].text == ":" && number(p + 2)) {
    const std::string primary = FormatNumber(std::sqrt(tokens_[p].number));
    const std::string secondary = FormatNumber(std::sqrt(tokens_[p + 2].number));
    return Error(ratio, fmt::format("{}: a transformer takes its turns, not its impedance "
                                    "ratio; an impedance ratio of {}:{} is a turns ratio of "
                                    "{}:{} (the impedance goes as the square of the turns): "
                                    "write turns {}:{}",
                                    context, tokens_[p].text, tokens_[p + 2].text, primary,
                                    secondary, primary, secondary));
  }
  return Error(ratio, fmt::format("{}: a transformer takes its turns, not its impedance "
                                  "ratio; write turns P:S (transmitter side : antenna side), "
                                  "the square roots of the impedance ratio: an impedance ratio "
                                  "of 1:49 is turns 1:7",
                                  context));
}

// ---- line ---------------------------------------------------------------------------------

std::string Parser::CableList() {
  std::string list;
  for (const CableInfo& c : CableTable()) list += (list.empty() ? "" : ", ") + c.name;
  return list;
}

// "rg58" -> "RG-58": the table name that differs only in case and dashes, else the nearest.
std::string Parser::CableHint(const std::string& written) {
  auto fold = [](const std::string& s) {
    std::string r;
    for (char c : s) {
      if (c != '-') r += static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
    }
    return r;
  };
  std::vector<std::string> names;
  for (const CableInfo& c : CableTable()) {
    if (fold(c.name) == fold(written)) return fmt::format(" (did you mean '{}'?)", c.name);
    names.push_back(c.name);
  }
  return DidYouMeanAside(written, names);
}

void Parser::FeedLine(const Token& keyword) {
  const ChainHead head =
      ReadChainHead(keyword, "line", "a line name (line NAME at FEED length LEN cable=NAME)",
                    line_lines_, feed_line_);
  FeedLineSpec line = Started<FeedLineSpec>(head.named);
  line.feed = head.feed;
  const std::string& context = head.named.context;
  const std::string either = "give either cable=NAME or z0=, velocity= and loss=, not both";
  ChainStatement statement;
  statement.context = context;
  statement.clause_list = "length LEN and either cable=NAME or z0=Z velocity=VF [loss=DB@F,DB@F]";
  statement.clauses = {
      {.word = "length",
       .equals = false,
       .quantity = &LengthQuantity(),
       .bare_factor = length_factor_,
       .kind = ValueKind::kLineLengthM,
       .store = [&](double v) { line.length_m = v; }},
      {.word = "cable",
       .check = ClauseCheck::kTokens,
       .group = 1,
       .side = 1,
       .either = either,
       .read_tokens = [&](const Token&) { Cable(context, &line); }},
      {.word = "z0",
       .quantity = &ResistanceQuantity(),
       .kind = ValueKind::kImpedanceOhm,
       .group = 1,
       .side = 2,
       .either = either,
       .store = [&](double v) { line.z0_ohm = v; }},
      {.word = "velocity",
       .check = ClauseCheck::kValue,
       .group = 1,
       .side = 2,
       .either = either,
       .read_value =
           [&](const Token&, const Measured& m) {
             const double vf = Plain(m, context + ": velocity", "the velocity factor, as in 0.66");
             if (!(vf > 0.0 && vf <= 1.0)) {
               throw Error(m.start, fmt::format("{}: velocity is the velocity factor, above 0 "
                                                "and at most 1; got {}",
                                                context, FormatNumber(vf)));
             }
             line.velocity_factor = vf;
           }},
      {.word = "loss",
       .check = ClauseCheck::kTokens,
       .group = 1,
       .side = 2,
       .either = either,
       .read_tokens = [&](const Token& word) { Loss(context, word, &line); }},
  };
  const std::map<std::string, Token> given = ReadChainClauses(statement);
  if (given.count("length") == 0) throw Expected(context, "'length LEN' (the length of the line)");
  if (given.count("cable") == 0) {
    if (given.count("z0") == 0) {
      throw Expected(context, "'cable=NAME' or 'z0=Z velocity=VF loss=DB@F,DB@F' (cables: " +
                                  CableList() + ")");
    }
    if (given.count("velocity") == 0) {
      throw Expected(context, "'velocity=VF' (the velocity factor of the line)");
    }
    if (given.count("loss") == 0) line.loss_points = 0;  // documented: no loss= is a lossless line
  }
  // A matched loss beyond kMaxLineLossDb at its own loss figures overflows the line's
  // cosh and sinh (e^x overflows past x = 709 nepers, 6158 dB) long before any sweep.
  const double worst_db_per_100m =
      line.loss_points == 0 ? 0.0 : std::max(line.loss1_db_per_100m, line.loss2_db_per_100m);
  if (worst_db_per_100m * line.length_m / 100.0 > kMaxLineLossDb) {
    throw Error(given.at("length"),
                fmt::format("{}: a matched loss of {} dB over its {} m is more than {} dB; "
                            "no power would reach the antenna: shorten the line or lower its "
                            "loss",
                            context, FormatNumber(worst_db_per_100m * line.length_m / 100.0),
                            FormatNumber(line.length_m), FormatNumber(kMaxLineLossDb)));
  }
  line_lines_[line.name] = line.location;
  feed_line_[line.feed] = {line.name, line.location};
  model_.feed_lines.push_back(std::move(line));
}

// `cable=NAME` after the '=': a cable of the built-in table, with its z0, velocity and loss.
void Parser::Cable(const std::string& context, FeedLineSpec* line) {
  const Token& first = Peek();
  if (first.kind == TokenKind::kEnd) {
    throw Error(first, fmt::format("{}: missing a cable name after 'cable=' (the cables "
                                   "are {})",
                                   context, CableList()));
  }
  std::string written = Next().text;  // RG-58 is three tokens written without spaces
  while (Peek().kind != TokenKind::kEnd && !Peek().space_before) written += Next().text;
  const CableInfo* found = nullptr;
  for (const CableInfo& c : CableTable()) {
    if (c.name == written) found = &c;
  }
  if (found == nullptr) {
    throw Error(first, fmt::format("{}: unknown cable '{}'{}; the cables are {}, or give "
                                   "z0=, velocity= and loss=",
                                   context, Shorten(written), CableHint(written), CableList()));
  }
  line->cable = found->name;
  line->z0_ohm = found->z0_ohm;
  line->velocity_factor = found->velocity_factor;
  line->loss1_db_per_100m = found->loss1_db_per_100m;
  line->loss1_frequency_hz = found->loss1_frequency_hz;
  line->loss2_db_per_100m = found->loss2_db_per_100m;
  line->loss2_frequency_hz = found->loss2_frequency_hz;
  line->loss_points = 2;
}

// `loss=DB@F` or `loss=DB1@F1,DB2@F2` after the '=' (dB per 100 m, matched).
void Parser::Loss(const std::string& context, const Token& clause, FeedLineSpec* line) {
  double db[2] = {0.0, 0.0}, f[2] = {0.0, 0.0};
  int n = 0;
  Token first_start;
  while (true) {
    if (n == 2) {
      throw Error(Peek(), fmt::format("{}: loss takes one or two points (loss=1.3@10MHz,"
                                      "2.5@30MHz); remove the third",
                                      context));
    }
    const Measured m = Expression();
    if (n == 0) first_start = m.start;
    db[n] = Plain(m, context + ": loss", "dB per 100 m");
    if (db[n] < 0.0) {
      throw Error(m.start, fmt::format("{}: loss must not be negative; got {} dB/100 m", context,
                                       FormatNumber(db[n])));
    }
    InRange(ValueKind::kLossDbPer100m, db[n], m, context + ": loss");
    if (!IsPunct("@")) {
      throw Expected(context, "'@' and the frequency of the loss figure (loss=1.3@10MHz)");
    }
    Next();
    const Measured fm = Expression();
    f[n] = As(fm, FrequencyQuantity(), 1.0, context + ": loss=DB@F");
    if (f[n] > 0.0) InRange(ValueKind::kFrequencyHz, f[n], fm, context + ": loss=DB@F");
    if (!(f[n] > 0.0)) {
      throw Error(fm.start, fmt::format("{}: the frequency of a loss figure must be positive; "
                                        "got {} Hz",
                                        context, FormatNumber(f[n])));
    }
    ++n;
    if (!IsPunct(",")) break;
    Next();
  }
  line->loss1_db_per_100m = db[0];
  line->loss1_frequency_hz = f[0];
  line->loss_points = n;
  if (n == 1) return;
  if (f[0] == f[1]) {
    throw Error(first_start, fmt::format("{}: the two loss figures are at the same frequency "
                                         "{} MHz; give them at two frequencies",
                                         context, FormatNumber(f[0] / 1e6)));
  }
  if ((db[0] == 0.0) != (db[1] == 0.0)) {
    throw Error(first_start, fmt::format("{}: a line with loss at one frequency has loss at "
                                         "every frequency; give both figures positive, or "
                                         "both 0 for a lossless line",
                                         context));
  }
  line->loss2_db_per_100m = db[1];
  line->loss2_frequency_hz = f[1];
  const LossFit fit = FitLoss(*line);
  if (!fit.exact) {
    model_.warnings.push_back(Warning{
        Loc(clause),
        fmt::format(
            "{}: the loss grows {} between {} and {} MHz, which the conductor-plus-dielectric "
            "model cannot follow; the fit keeps only the {} term and misses a figure "
            "by {:.0f}%",
            context,
            fit.a_np_per_m_per_sqrt_hz > 0.0 ? "more slowly than sqrt(f)" : "faster than f",
            FormatNumber(f[0] / 1e6), FormatNumber(f[1] / 1e6),
            fit.a_np_per_m_per_sqrt_hz > 0.0 ? "sqrt(f)" : "f", 100.0 * fit.worst_misfit)});
  }
}

}  // namespace wirefield::model
